import { useRef, useState, type FormEvent } from "react";
import {
  describeMix,
  dilutionWaterPerKg,
  dropOffMix,
  dropOffQuantities,
  DROP_OFF_MIXES,
  SCRAP_CATEGORY_PROFILES,
  type DropOffMix,
} from "@shared/domain";
import { CreateFeedingSchema } from "@shared/schemas/feedings";
import type { StewardBudget } from "@shared/schemas/steward";
import { Alert, Button, Field, Input, Select, Textarea } from "@/components/ui";
import { ApiError } from "@/lib/api-client";
import { useCreateFeeding } from "../api/create-feeding";
import { formatNumber } from "../utils/format";
import { focusFirstInvalid, issuesToFields, numberOrUndefined, serverErrors } from "../utils/form-errors";

export type HandFeedingFormProps = {
  digesterId: number;
  digesterName: string;
  budget: StewardBudget;
  onChanged?: () => void;
  /** Called with a sentence saying what was recorded. */
  onSaved?: (message: string) => void;
};

/** Scraps added by hand (not from a drop-off), with the suggested dilution water and, beyond the budget, a reason. */
export function HandFeedingForm({ digesterId, digesterName, budget, onChanged, onSaved }: HandFeedingFormProps) {
  const create = useCreateFeeding(onChanged);
  const formRef = useRef<HTMLFormElement>(null);
  const [freshKg, setFreshKg] = useState("");
  const [mix, setMix] = useState<DropOffMix>("mixed");
  const [citrus, setCitrus] = useState("0");
  const [water, setWater] = useState("");
  const [note, setNote] = useState("");
  const [reason, setReason] = useState("");
  const [askReason, setAskReason] = useState(false);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);

  const kg = numberOrUndefined(freshKg);
  const citrusPercent = numberOrUndefined(citrus) ?? 0;
  const valid = kg !== undefined && Number.isFinite(kg) && kg > 0;
  // The same formulas the server uses (shared/domain): water to the target solids, kg VS of the mix.
  const suggestedWater = valid
    ? kg * dilutionWaterPerKg(describeMix(dropOffMix(mix, citrusPercent)).tsPercent, budget.targetTsPercent)
    : null;
  const kgVs = valid ? dropOffQuantities({ weightKg: kg, mix, citrusPercent }).kgVs : 0;
  const beyond = valid && kgVs > budget.budgetKgVs + 1e-6;
  const showReason = beyond || askReason;

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setFormError(null);
    setSaved(null);
    const body = {
      freshKg: kg as number,
      mix,
      citrusPercent,
      waterLitres: numberOrUndefined(water),
      note: note.trim() === "" ? undefined : note,
      ...(showReason ? { override: { reason } } : {}),
    };
    const parsed = CreateFeedingSchema.safeParse(body);
    if (!parsed.success) {
      setErrors(issuesToFields(parsed.error));
      focusFirstInvalid(formRef.current);
      return;
    }
    setErrors({});
    try {
      const result = await create.mutateAsync({ digesterId, body });
      const message = `${formatNumber(result.feeding.freshKg)} kg with ${formatNumber(result.feeding.waterLitres)} L of water recorded.`;
      setSaved(message);
      setFreshKg("");
      setWater("");
      setNote("");
      setReason("");
      setAskReason(false);
      onSaved?.(message);
    } catch (err) {
      if (err instanceof ApiError && err.status === 409 && err.fields.override && !showReason) setAskReason(true);
      const { fields, form } = serverErrors(err, [
        "freshKg",
        "mix",
        "citrusPercent",
        "waterLitres",
        "note",
        "override",
        "override.reason",
      ]);
      setErrors({ ...fields, ...(fields.override ? { "override.reason": fields.override } : {}) });
      setFormError(form);
      focusFirstInvalid(formRef.current);
    }
  };

  return (
    <form
      ref={formRef}
      noValidate
      onSubmit={submit}
      aria-label={`Add scraps by hand to ${digesterName}`}
      className="flex flex-col gap-4"
    >
      {saved ? <Alert variant="success" title={saved} /> : null}
      {formError ? (
        <Alert variant="danger" title="Not recorded" announce="assertive">
          <p>{formError}</p>
        </Alert>
      ) : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Scraps (kg)" error={errors.freshKg} required>
          <Input inputMode="decimal" autoComplete="off" value={freshKg} onChange={(e) => setFreshKg(e.target.value)} />
        </Field>
        <Field label="What is in it" error={errors.mix}>
          <Select
            value={mix}
            onChange={(e) => setMix(e.target.value as DropOffMix)}
            options={DROP_OFF_MIXES.map((m) => ({ value: m, label: SCRAP_CATEGORY_PROFILES[m].label }))}
          />
        </Field>
        <Field label="Citrus share (%)" hint="Keep it at or below 10 %." error={errors.citrusPercent}>
          <Input inputMode="decimal" autoComplete="off" value={citrus} onChange={(e) => setCitrus(e.target.value)} />
        </Field>
        <Field
          label="Dilution water (litres)"
          hint={
            suggestedWater === null
              ? "Leave empty to record the suggested amount."
              : `Leave empty to record the suggested ${formatNumber(suggestedWater)} L.`
          }
          error={errors.waterLitres}
        >
          <Input inputMode="decimal" autoComplete="off" value={water} onChange={(e) => setWater(e.target.value)} />
        </Field>
      </div>
      {showReason ? (
        <Field
          label="Why feed beyond today's budget?"
          hint={`Today's room is about ${formatNumber(budget.budgetKgScraps)} kg of mixed scraps. The reason is kept with the record.`}
          error={errors["override.reason"]}
          required
        >
          <Textarea rows={2} value={reason} onChange={(e) => setReason(e.target.value)} />
        </Field>
      ) : null}
      <Field label="Note" hint="Optional." error={errors.note}>
        <Textarea rows={2} value={note} onChange={(e) => setNote(e.target.value)} />
      </Field>
      <div>
        <Button type="submit" loading={create.isPending}>
          Record feeding
        </Button>
      </div>
    </form>
  );
}
