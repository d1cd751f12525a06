import { useRef, useState, type FormEvent } from "react";
import { OLR_REF_CAP_KG_VS_PER_M3_DAY } from "@shared/domain";
import {
  DIGESTER_HEATINGS,
  DIGESTER_INSULATIONS,
  UpdateDigesterProfileSchema,
  type DigesterProfile,
} from "@shared/schemas/digester";
import { Alert, Button, Field, Input, Select, Textarea } from "@/components/ui";
import { ApiError } from "@/lib/api-client";
import { useUpdateProfile } from "../api/update-profile";

const heatingWords: Record<(typeof DIGESTER_HEATINGS)[number], string> = {
  none: "None",
  solar: "Solar",
  electric: "Electric",
  "waste-heat": "Waste heat",
};
const insulationWords: Record<(typeof DIGESTER_INSULATIONS)[number], string> = {
  none: "None",
  partial: "Partial",
  full: "Full",
};

type TextFields = {
  name: string;
  siteDescription: string;
  workingVolumeM3: string;
  drumDiameterM: string;
  drumMassKg: string;
  addedMassKg: string;
  burnerLitresPerHour: string;
  heating: string;
  insulation: string;
  startedOn: string;
  gasFirstBurnedOn: string;
  olrRefKgVsPerM3Day: string;
  olrOverrideReason: string;
  targetTsPercent: string;
  bucketKgPerLitre: string;
};

const text = (v: number | string | null) => (v === null ? "" : String(v));
const num = (v: string) => (v.trim() === "" ? undefined : Number(v.trim().replace(",", ".")));
const numOrNull = (v: string) => (v.trim() === "" ? null : Number(v.trim().replace(",", ".")));

function fromProfile(p: DigesterProfile): TextFields {
  return {
    name: p.name,
    siteDescription: p.siteDescription,
    workingVolumeM3: text(p.workingVolumeM3),
    drumDiameterM: text(p.drumDiameterM),
    drumMassKg: text(p.drumMassKg),
    addedMassKg: text(p.addedMassKg),
    burnerLitresPerHour: text(p.burnerLitresPerHour),
    heating: p.heating,
    insulation: p.insulation,
    startedOn: p.startedOn,
    gasFirstBurnedOn: text(p.gasFirstBurnedOn),
    olrRefKgVsPerM3Day: text(p.olrRefKgVsPerM3Day),
    olrOverrideReason: text(p.olrOverrideReason),
    targetTsPercent: text(p.targetTsPercent),
    bucketKgPerLitre: text(p.bucketKgPerLitre),
  };
}

/** The digester's settings: size, gas holder, burner, heating, start-up dates and loading settings within DOMAIN.md's bounds. */
export function ProfileForm({ profile, onChanged }: { profile: DigesterProfile; onChanged?: () => void }) {
  const update = useUpdateProfile(profile.id, onChanged);
  const formRef = useRef<HTMLFormElement>(null);
  const [v, setV] = useState<TextFields>(() => fromProfile(profile));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const set = (name: keyof TextFields) => (e: { target: { value: string } }) =>
    setV((old) => ({ ...old, [name]: e.target.value }));
  const olr = num(v.olrRefKgVsPerM3Day);
  const needsReason = olr !== undefined && olr > OLR_REF_CAP_KG_VS_PER_M3_DAY;

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setFormError(null);
    setSaved(false);
    const body = {
      name: v.name,
      siteDescription: v.siteDescription,
      workingVolumeM3: num(v.workingVolumeM3),
      drumDiameterM: numOrNull(v.drumDiameterM),
      drumMassKg: numOrNull(v.drumMassKg),
      addedMassKg: num(v.addedMassKg),
      burnerLitresPerHour: num(v.burnerLitresPerHour),
      heating: v.heating as DigesterProfile["heating"],
      insulation: v.insulation as DigesterProfile["insulation"],
      startedOn: v.startedOn,
      gasFirstBurnedOn: v.gasFirstBurnedOn === "" ? null : v.gasFirstBurnedOn,
      olrRefKgVsPerM3Day: olr,
      olrOverrideReason: needsReason ? v.olrOverrideReason : null,
      targetTsPercent: num(v.targetTsPercent),
      bucketKgPerLitre: num(v.bucketKgPerLitre),
    };
    const fieldErrors: Record<string, string> = {};
    const parsed = UpdateDigesterProfileSchema.safeParse(body);
    if (!parsed.success)
      for (const issue of parsed.error.issues)
        fieldErrors[issue.path.map(String).join(".") || "form"] ??= issue.message;
    if (needsReason && v.olrOverrideReason.trim().length < 3) {
      fieldErrors.olrOverrideReason = `Above ${OLR_REF_CAP_KG_VS_PER_M3_DAY} kg VS/m³/day, say why this digester can take more (heated, stirred, tested).`;
    }
    if (Object.keys(fieldErrors).length > 0) {
      setErrors(fieldErrors);
      requestAnimationFrame(() => formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
      return;
    }
    setErrors({});
    try {
      const after = await update.mutateAsync({ id: profile.id, body });
      setV(fromProfile(after));
      setSaved(true);
    } catch (err) {
      if (err instanceof ApiError && Object.keys(err.fields).length > 0) setErrors(err.fields);
      else setFormError(err instanceof ApiError ? err.message : "Something went wrong. Please try again.");
    }
  };

  const numberInput = (name: keyof TextFields, label: string, hint?: string, required = false) => (
    <Field label={label} hint={hint} error={errors[name]} required={required}>
      <Input inputMode="decimal" autoComplete="off" value={v[name]} onChange={set(name)} />
    </Field>
  );

  return (
    <form ref={formRef} noValidate onSubmit={submit} aria-label="Digester settings" className="flex flex-col gap-6">
      {saved ? <Alert variant="success" title="Settings saved" /> : null}
      {formError ? (
        <Alert variant="danger" title="The settings were not saved" announce="assertive">
          <p>{formError}</p>
        </Alert>
      ) : null}
      {Object.keys(errors).length > 0 ? (
        <Alert variant="danger" title="Please check the fields marked below" announce="assertive" />
      ) : null}
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-lg font-bold">The digester</legend>
        <Field label="Name" error={errors.name} required>
          <Input autoComplete="off" value={v.name} onChange={set("name")} />
        </Field>
        {numberInput(
          "workingVolumeM3",
          "Working volume (m³)",
          "The slurry volume, not the tank's outside size: 0.05 to 100 m³.",
          true,
        )}
        <Field
          label="Where it is"
          hint="How to find it on the site."
          error={errors.siteDescription}
          className="sm:col-span-2"
        >
          <Textarea rows={2} value={v.siteDescription} onChange={set("siteDescription")} />
        </Field>
        <Field label="Heating" error={errors.heating}>
          <Select
            value={v.heating}
            onChange={set("heating")}
            options={DIGESTER_HEATINGS.map((h) => ({ value: h, label: heatingWords[h] }))}
          />
        </Field>
        <Field label="Insulation" error={errors.insulation}>
          <Select
            value={v.insulation}
            onChange={set("insulation")}
            options={DIGESTER_INSULATIONS.map((i) => ({ value: i, label: insulationWords[i] }))}
          />
        </Field>
        <Field label="Start-up began on" error={errors.startedOn} required>
          <Input type="date" value={v.startedOn} onChange={set("startedOn")} />
        </Field>
        <Field
          label="Gas first burned on"
          hint="Leave empty while it does not burn yet: no feed until then."
          error={errors.gasFirstBurnedOn}
        >
          <Input type="date" value={v.gasFirstBurnedOn} onChange={set("gasFirstBurnedOn")} />
        </Field>
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-lg font-bold">Gas holder and burner</legend>
        {numberInput("drumDiameterM", "Drum diameter (m)", "Floating drum only; leave empty for a bag.")}
        {numberInput("drumMassKg", "Drum mass (kg)")}
        {numberInput("addedMassKg", "Added weights (kg)", "Weights on the drum raise the gas pressure.")}
        {numberInput("burnerLitresPerHour", "Burner flow (litres per hour)", "Usual stoves use 300–400 L/h.")}
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-lg font-bold">Loading settings</legend>
        {numberInput(
          "olrRefKgVsPerM3Day",
          "Reference loading rate (kg VS per m³ per day)",
          `At 30 °C and above. The usual upper load of simple plants is 1.5; above ${OLR_REF_CAP_KG_VS_PER_M3_DAY} only with a reason.`,
        )}
        {numberInput(
          "targetTsPercent",
          "Target slurry solids (%)",
          "Scraps are diluted to this: 2 to 15 %, usually 8 %.",
        )}
        {numberInput(
          "bucketKgPerLitre",
          "Bucket density (kg per litre)",
          "For buckets that were not weighed: 0.1 to 1.2, usually 0.5.",
        )}
        {needsReason ? (
          <Field
            label="Why it can take more than 2.0"
            error={errors.olrOverrideReason}
            required
            className="sm:col-span-2"
          >
            <Textarea rows={2} value={v.olrOverrideReason} onChange={set("olrOverrideReason")} />
          </Field>
        ) : null}
      </fieldset>
      <div>
        <Button type="submit" loading={update.isPending}>
          Save settings
        </Button>
      </div>
    </form>
  );
}
