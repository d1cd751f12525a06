import { useEffect, useId, useMemo, useRef, useState, type FormEvent } from "react";
import {
  DEFAULT_BUCKET_KG_PER_LITRE,
  DROP_OFF_MIXES,
  REFUSE_ITEMS,
  REFUSE_ITEM_INFO,
  dropOffQuantities,
  type DropOffMix,
} from "@shared/domain";
import { haversineM } from "@shared/domain/geo";
import type { DigesterSummary } from "@shared/schemas/digester";
import { CreateDropOffSchema, type CreatedDropOff } from "@shared/schemas/drop-offs";
import { Alert, Button, Checkbox, Field, Input, RadioGroup, Select, Textarea } from "@/components/ui";
import { newIdempotencyKey, useCreateDropOff } from "../api/create-drop-off";
import { dayText, kg, mixLabels } from "../utils/labels";
import { nextDay, previewWelcome, roomKgScraps, type LatLng } from "../utils/welcome";
import { focusFirstInvalid, readNumber, serverFieldErrors, zodFieldErrors, type FieldErrors } from "@/lib/form";

const BUCKET_SIZES_L = [5, 7, 10, 12, 15, 20, 25];
const CITRUS_CHOICES = [
  { value: "0", label: "None" },
  { value: "10", label: "A little (about a tenth)" },
  { value: "25", label: "About a quarter" },
  { value: "50", label: "About half or more" },
];
const FIELDS = [
  "digesterId",
  "bucketCount",
  "bucketLitres",
  "weightKg",
  "mix",
  "citrusPercent",
  "note",
  "noRefuseConfirmed",
  "forDate",
];
const LAST_BUCKET_KEY = "hearthloop.bucketLitres";

function rememberedBucketLitres(): string {
  try {
    const saved = localStorage.getItem(LAST_BUCKET_KEY);
    return saved && BUCKET_SIZES_L.includes(Number(saved)) ? saved : "10";
  } catch {
    return "10";
  }
}

function roomWords(d: DigesterSummary, bucketLitres: number): string {
  if (d.status !== "active")
    return d.status === "resting" ? "Resting: takes no scraps now" : "Offline: takes no scraps now";
  const room = roomKgScraps(d);
  if (room < 0.05) return "No room left today";
  const buckets = Math.floor(room / (bucketLitres * DEFAULT_BUCKET_KG_PER_LITRE));
  return `Room today: about ${kg(room)}${buckets >= 1 ? ` (${buckets} ${buckets === 1 ? "bucket" : "buckets"} of ${bucketLitres} L)` : ""}`;
}

const metres = (m: number) =>
  m >= 1000 ? `${(m / 1000).toLocaleString("en-GB", { maximumFractionDigits: 1 })} km` : `${Math.round(m / 10) * 10} m`;

export type LogDropOffFormProps = {
  digesters: DigesterSummary[];
  /** The digester to start with (the household's, or the one chosen on the map). */
  initialDigesterId: number | null;
  /** The household's own digester, marked in the list. */
  householdDigesterId: number | null;
  home: LatLng | null;
  onLogged: (created: CreatedDropOff) => void;
};

/**
 * Log a drop-off in a few taps: the household's digester is chosen already, one 10-litre
 * bucket of mixed scraps is the starting point, and the refuse check is the one box to tick.
 * While it is filled in, the form says whether today's room at that digester welcomes it.
 */
export function LogDropOffForm({
  digesters,
  initialDigesterId,
  householdDigesterId,
  home,
  onLogged,
}: LogDropOffFormProps) {
  const id = useId();
  const formRef = useRef<HTMLFormElement>(null);
  const create = useCreateDropOff();
  const firstOpen = digesters.find((d) => d.status === "active")?.id ?? digesters[0]?.id ?? null;
  const [digesterId, setDigesterId] = useState(String(initialDigesterId ?? firstOpen ?? ""));
  const [bucketCount, setBucketCount] = useState("1");
  const [bucketLitres, setBucketLitres] = useState(rememberedBucketLitres);
  const [weightKg, setWeightKg] = useState("");
  const [mix, setMix] = useState<DropOffMix>("mixed");
  const [citrus, setCitrus] = useState("0");
  const [note, setNote] = useState("");
  const [noRefuse, setNoRefuse] = useState(false);
  const [forTomorrow, setForTomorrow] = useState(false);
  const [errors, setErrors] = useState<FieldErrors>({});
  // One key per drop-off: a resend of the same body reuses it, a changed body gets a new one.
  const attempt = useRef<{ key: string; body: string } | null>(null);

  const chosen = digesters.find((d) => String(d.id) === digesterId) ?? null;
  // The household's own digester first, then the nearest ones.
  const ordered = useMemo(() => {
    const distance = (d: DigesterSummary) => (home ? (haversineM(home, d.location) as number) : 0);
    return [...digesters].sort(
      (a, b) =>
        Number(b.id === householdDigesterId) - Number(a.id === householdDigesterId) ||
        distance(a) - distance(b) ||
        a.name.localeCompare(b.name),
    );
  }, [digesters, home, householdDigesterId]);
  const today = digesters[0]?.today.date ?? new Date().toISOString().slice(0, 10);
  const tomorrow = nextDay(today);

  const body = {
    digesterId: Number(digesterId) || 0,
    ...(weightKg.trim() === "" ? {} : { weightKg: readNumber(weightKg) }),
    bucketCount: readNumber(bucketCount),
    bucketLitres: readNumber(bucketLitres),
    mix,
    citrusPercent: Number(citrus),
    note,
    noRefuseConfirmed: noRefuse,
    ...(forTomorrow ? { forDate: tomorrow } : {}),
  };

  // The quantities as the server will compute them (shared/domain), for the welcome shown now.
  const quantities = useMemo(() => {
    const n = (v: unknown) => (typeof v === "number" && Number.isFinite(v) && v > 0 ? v : null);
    const weight = n(readNumber(weightKg));
    const count = n(readNumber(bucketCount));
    const litres = n(readNumber(bucketLitres));
    if (weight === null && (count === null || litres === null)) return null;
    return dropOffQuantities({
      bucketCount: count,
      bucketLitres: litres,
      weightKg: weight,
      mix,
      citrusPercent: Number(citrus),
    });
  }, [weightKg, bucketCount, bucketLitres, mix, citrus]);

  const preview =
    chosen && quantities && !forTomorrow ? previewWelcome(chosen, digesters, quantities.kgVs, home) : null;

  useEffect(() => {
    try {
      localStorage.setItem(LAST_BUCKET_KEY, bucketLitres);
    } catch {
      // Private browsing may refuse storage; the default is fine then.
    }
  }, [bucketLitres]);

  const onSubmit = async (event: FormEvent) => {
    event.preventDefault();
    const parsed = CreateDropOffSchema.safeParse(body);
    if (!parsed.success) {
      setErrors(zodFieldErrors(parsed.error));
      focusFirstInvalid(formRef.current);
      return;
    }
    setErrors({});
    const sent = JSON.stringify(parsed.data);
    if (!attempt.current || attempt.current.body !== sent) attempt.current = { key: newIdempotencyKey(), body: sent };
    try {
      const created = await create.mutateAsync({ body: parsed.data, idempotencyKey: attempt.current.key });
      attempt.current = null;
      onLogged(created);
    } catch (err) {
      setErrors(serverFieldErrors(err, FIELDS));
      focusFirstInvalid(formRef.current);
    }
  };

  const count = Object.keys(errors).length;
  const litresNumber = Number(bucketLitres) || 10;

  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate aria-labelledby={`${id}-title`} className="flex flex-col gap-6">
      <h2 id={`${id}-title`} className="sr-only">
        Drop-off details
      </h2>
      {count > 0 ? (
        <Alert
          variant="danger"
          title={errors.form ? "Not logged" : `Please check ${count === 1 ? "one thing" : `${count} things`}`}
          announce="assertive"
        >
          {errors.form ? <p>{errors.form}</p> : <p>Each problem is written under its field.</p>}
        </Alert>
      ) : null}

      <RadioGroup
        legend="Digester"
        name="digesterId"
        value={digesterId}
        onValueChange={setDigesterId}
        error={errors.digesterId}
        options={ordered.map((d) => ({
          value: String(d.id),
          label: d.id === householdDigesterId ? `${d.name} (your digester)` : d.name,
          description: roomWords(d, litresNumber),
          disabled: d.status !== "active",
        }))}
      />

      <fieldset className="flex min-w-0 flex-col gap-4">
        <legend className="mb-1 font-bold">How much?</legend>
        <div className="grid grid-cols-2 gap-3">
          <Field label="Buckets" error={errors.bucketCount}>
            <Input
              inputMode="numeric"
              autoComplete="off"
              value={bucketCount}
              onChange={(e) => setBucketCount(e.target.value)}
            />
          </Field>
          <Field label="Bucket size" error={errors.bucketLitres}>
            <Select
              value={bucketLitres}
              onChange={(e) => setBucketLitres(e.target.value)}
              options={BUCKET_SIZES_L.map((l) => ({ value: String(l), label: `${l} litres` }))}
            />
          </Field>
        </div>
        <Field
          label="Weight in kg, if you weighed it"
          hint="A weight counts instead of the bucket estimate."
          error={errors.weightKg}
        >
          <Input
            inputMode="decimal"
            autoComplete="off"
            value={weightKg}
            onChange={(e) => setWeightKg(e.target.value)}
            className="max-w-40"
          />
        </Field>
        {quantities ? (
          <p className="text-base text-muted">
            {quantities.massSource === "weighed"
              ? `${kg(quantities.freshKg)}, weighed.`
              : `About ${kg(quantities.freshKg)} (a full bucket weighs about half a kilo per litre).`}
          </p>
        ) : null}
      </fieldset>

      <RadioGroup
        legend="What is in it?"
        name="mix"
        value={mix}
        onValueChange={(v) => setMix(v as DropOffMix)}
        layout="grid"
        error={errors.mix}
        options={DROP_OFF_MIXES.map((m) => ({ value: m, label: mixLabels[m] }))}
      />

      <Field
        label="How much of it is citrus peel?"
        hint="Peel oil slows the digester: a tenth of a day's scraps at most."
        error={errors.citrusPercent}
      >
        <Select value={citrus} onChange={(e) => setCitrus(e.target.value)} options={CITRUS_CHOICES} />
      </Field>

      <Field label="Note for the steward (optional)" error={errors.note}>
        <Textarea rows={2} maxLength={500} value={note} onChange={(e) => setNote(e.target.value)} />
      </Field>

      <div className="flex flex-col gap-2 rounded-md border-2 border-border bg-surface p-4">
        <p id={`${id}-refuse`} className="text-base">
          <strong>Never in the bucket:</strong>{" "}
          {REFUSE_ITEMS.map((item) => REFUSE_ITEM_INFO[item].label.toLowerCase()).join("; ")}.
        </p>
        <Checkbox
          label={
            <>
              Nothing from this list is in it <span className="text-muted">(required)</span>
            </>
          }
          checked={noRefuse}
          onChange={(e) => setNoRefuse(e.target.checked)}
          error={errors.noRefuseConfirmed}
          aria-describedby={`${id}-refuse`}
          required
        />
      </div>

      {forTomorrow ? (
        <Alert variant="info" title={`For tomorrow, ${dayText(tomorrow)}`} announce="polite">
          <p>Tomorrow's room depends on tomorrow's readings; the steward confirms when you bring it.</p>
          <Button type="button" variant="ghost" size="sm" onClick={() => setForTomorrow(false)}>
            Log it for today instead
          </Button>
        </Alert>
      ) : preview && chosen ? (
        <WelcomePreview
          preview={preview}
          chosen={chosen}
          onChoose={(d) => setDigesterId(String(d))}
          onTomorrow={() => setForTomorrow(true)}
        />
      ) : null}

      <Button type="submit" size="lg" loading={create.isPending} className="w-full sm:w-auto">
        Log drop-off
      </Button>
    </form>
  );
}

function WelcomePreview({
  preview,
  chosen,
  onChoose,
  onTomorrow,
}: {
  preview: ReturnType<typeof previewWelcome>;
  chosen: DigesterSummary;
  onChoose: (digesterId: number) => void;
  onTomorrow: () => void;
}) {
  if (preview.kind === "welcome") {
    return (
      <Alert variant="success" title={`Welcome at ${chosen.name} today`}>
        <p>It has room for about {kg(preview.roomKg)} of scraps before yours.</p>
      </Alert>
    );
  }
  const alternative = preview.kind === "full" ? preview.alternative : null;
  return (
    <Alert
      variant="warning"
      title={
        preview.kind === "closed" ? `${chosen.name} takes no scraps now` : `${chosen.name} has no room for this today`
      }
    >
      <p>
        {preview.kind === "closed"
          ? (chosen.statusReason ?? "A steward has paused it.")
          : preview.noRoomLeft
            ? chosen.today.explanation
            : `It has room for only about ${kg(preview.roomKg)} today.`}
      </p>
      <div className="mt-2 flex flex-wrap gap-2">
        {alternative ? (
          <Button type="button" variant="outline" size="sm" onClick={() => onChoose(alternative.digester.id)}>
            Take it to {alternative.digester.name}
            {alternative.distanceM !== null ? ` (${metres(alternative.distanceM)})` : ""}
          </Button>
        ) : null}
        {preview.kind === "full" ? (
          <Button type="button" variant="outline" size="sm" onClick={onTomorrow}>
            Log it for tomorrow
          </Button>
        ) : null}
      </div>
    </Alert>
  );
}
