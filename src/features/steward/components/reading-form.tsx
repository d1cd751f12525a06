import { useRef, useState, type FormEvent } from "react";
import { CreateReadingSchema, READING_RANGES } from "@shared/schemas/readings";
import { Alert, Button, Field, Input, Textarea } from "@/components/ui";
import { useCreateReading } from "../api/create-reading";
import { formatDateTime } from "../utils/format";
import { focusFirstInvalid, issuesToFields, numberOrUndefined, serverErrors } from "../utils/form-errors";

const FIELDS = [
  "temperatureC",
  "ph",
  "titrationAMl",
  "titrationBMl",
  "vfaTaRatio",
  "gasLevelPercent",
  "drumRiseM",
  "gasUsedMinutes",
  "note",
] as const;
type FieldName = (typeof FIELDS)[number];

/** Now as the value of a datetime-local input (local time, minutes). */
function localNow(): string {
  const d = new Date();
  d.setSeconds(0, 0);
  return new Date(d.getTime() - d.getTimezoneOffset() * 60_000).toISOString().slice(0, 16);
}

function range(name: keyof typeof READING_RANGES): string {
  const r = READING_RANGES[name];
  return `${r.min} to ${r.max}${r.unit ? ` ${r.unit}` : ""}`;
}

export type ReadingFormProps = {
  digesterId: number;
  digesterName: string;
  onChanged?: () => void;
  /** Called with a sentence saying what was saved (e.g. to close a dialog and announce it). */
  onSaved?: (message: string) => void;
};

/**
 * Quick entry of a reading: temperature, pH, titration (A and B, or the ratio), gas-holder level
 * or drum rise, minutes of gas used and a note. Checked with the API's own schema before sending.
 */
export function ReadingForm({ digesterId, digesterName, onChanged, onSaved }: ReadingFormProps) {
  const create = useCreateReading(onChanged);
  const formRef = useRef<HTMLFormElement>(null);
  const [takenAt, setTakenAt] = useState(localNow);
  const [values, setValues] = useState<Record<FieldName, string>>(
    () => Object.fromEntries(FIELDS.map((f) => [f, ""])) as Record<FieldName, string>,
  );
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);

  const set = (name: FieldName) => (e: { target: { value: string } }) =>
    setValues((v) => ({ ...v, [name]: e.target.value }));

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setFormError(null);
    setSaved(null);
    const when = new Date(takenAt);
    const body = {
      takenAt: Number.isNaN(when.getTime()) ? "" : when.toISOString(),
      temperatureC: numberOrUndefined(values.temperatureC),
      ph: numberOrUndefined(values.ph),
      titrationAMl: numberOrUndefined(values.titrationAMl),
      titrationBMl: numberOrUndefined(values.titrationBMl),
      vfaTaRatio: numberOrUndefined(values.vfaTaRatio),
      gasLevelPercent: numberOrUndefined(values.gasLevelPercent),
      drumRiseM: numberOrUndefined(values.drumRiseM),
      gasUsedMinutes: numberOrUndefined(values.gasUsedMinutes),
      note: values.note.trim() === "" ? undefined : values.note,
    };
    const parsed = CreateReadingSchema.safeParse(body);
    if (!parsed.success) {
      setErrors(issuesToFields(parsed.error));
      focusFirstInvalid(formRef.current);
      return;
    }
    setErrors({});
    try {
      const reading = await create.mutateAsync({ digesterId, body });
      const message = `Reading of ${formatDateTime(reading.takenAt)} saved${reading.vfaTaRatio !== null && body.vfaTaRatio === undefined && body.titrationAMl !== undefined ? `; acids/alkalinity ratio ${reading.vfaTaRatio.toFixed(2)}` : ""}.`;
      setSaved(message);
      setValues(Object.fromEntries(FIELDS.map((f) => [f, ""])) as Record<FieldName, string>);
      setTakenAt(localNow());
      onSaved?.(message);
    } catch (err) {
      const { fields, form } = serverErrors(err, ["takenAt", ...FIELDS]);
      setErrors(fields);
      setFormError(form);
      focusFirstInvalid(formRef.current);
    }
  };

  const numberField = (name: Exclude<FieldName, "note">, label: string, hint: string) => (
    <Field label={label} hint={hint} error={errors[name]}>
      <Input inputMode="decimal" autoComplete="off" value={values[name]} onChange={set(name)} />
    </Field>
  );

  return (
    <form
      ref={formRef}
      noValidate
      onSubmit={submit}
      aria-label={`Log a reading for ${digesterName}`}
      className="flex flex-col gap-4"
    >
      {saved ? <Alert variant="success" title={saved} /> : null}
      {formError ? (
        <Alert variant="danger" title="The reading was not saved" announce="assertive">
          <p>{formError}</p>
        </Alert>
      ) : null}
      {Object.keys(errors).length > 0 ? (
        <Alert variant="danger" title="Please check the fields marked below" announce="assertive" />
      ) : null}
      <Field label="Taken at" hint="Your local time." error={errors.takenAt} required>
        <Input type="datetime-local" value={takenAt} onChange={(e) => setTakenAt(e.target.value)} />
      </Field>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-lg font-bold">Temperature and pH</legend>
        {numberField("temperatureC", "Digester temperature (°C)", `Inside the digester, ${range("temperatureC")}.`)}
        {numberField("ph", "pH", range("ph"))}
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-lg font-bold">Acids and alkalinity (titration)</legend>
        {numberField("titrationAMl", "Titration A (mL)", "Acid to pH 5.0, 20 mL sample.")}
        {numberField("titrationBMl", "Titration B (mL)", "Acid from pH 5.0 to 4.4.")}
        {numberField("vfaTaRatio", "Or the ratio (FOS/TAC)", "If your kit gives it; with A and B it is worked out.")}
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-lg font-bold">Gas</legend>
        {numberField("gasLevelPercent", "Gas-holder level (%)", range("gasLevelPercent"))}
        {numberField("drumRiseM", "Drum rise (m)", "How far the drum has risen.")}
        {numberField("gasUsedMinutes", "Minutes of gas used", "Cooking time since the last reading.")}
      </fieldset>
      <Field label="Note" hint="Optional: smell, foam, what you did." error={errors.note}>
        <Textarea rows={2} value={values.note} onChange={set("note")} />
      </Field>
      <div>
        <Button type="submit" loading={create.isPending}>
          Save reading
        </Button>
      </div>
    </form>
  );
}
