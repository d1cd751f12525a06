import { useRef, useState, type FormEvent } from "react";
import { TURNED_AWAY_REASONS, type TurnedAwayReason } from "@shared/schemas/drop-offs";
import {
  AcceptDropOffSchema,
  FeedDropOffSchema,
  TURN_AWAY_REASON_CHOICES,
  TurnAwayDropOffSchema,
  type StewardDropOff,
} from "@shared/schemas/steward";
import { Alert, Button, Dialog, Field, Input, RadioGroup, Textarea } from "@/components/ui";
import type { DropOffDecisionRequest } from "../api/decide-drop-off";
import { amountText, formatNumber } from "../utils/format";
import { focusFirstInvalid, issuesToFields, numberOrUndefined, serverErrors } from "../utils/form-errors";

export type DecisionDialogState =
  | { type: "feed"; dropOff: StewardDropOff; acceptFirst: boolean }
  | { type: "override"; dropOff: StewardDropOff }
  | { type: "turn-away"; dropOff: StewardDropOff };

export type DecisionDialogProps = {
  state: DecisionDialogState | null;
  onClose: () => void;
  /** Sends the decision; rejects with the API error so the dialog can show it. */
  decide: (request: DropOffDecisionRequest) => Promise<unknown>;
  pending: boolean;
};

const overrideHint =
  "Beyond today's budget the digester may turn sour. Say why it should go in anyway; the reason is kept with the record.";

/** The dialogs behind "Accept and feed", "Feed", accepting beyond the budget, and "Turn away". */
export function DecisionDialog({ state, onClose, decide, pending }: DecisionDialogProps) {
  if (!state) return <Dialog open={false} onClose={onClose} title="" />;
  const key = `${state.type}-${state.dropOff.id}`;
  if (state.type === "feed")
    return <FeedDialog key={key} state={state} onClose={onClose} decide={decide} pending={pending} />;
  if (state.type === "override")
    return <OverrideDialog key={key} state={state} onClose={onClose} decide={decide} pending={pending} />;
  return <TurnAwayDialog key={key} state={state} onClose={onClose} decide={decide} pending={pending} />;
}

type Inner<S> = { state: S; onClose: () => void; decide: DecisionDialogProps["decide"]; pending: boolean };

function FeedDialog({ state, onClose, decide, pending }: Inner<Extract<DecisionDialogState, { type: "feed" }>>) {
  const d = state.dropOff;
  const needsOverride = !d.fitsToday;
  const formRef = useRef<HTMLFormElement>(null);
  const [water, setWater] = useState(String(d.suggestedWaterLitres));
  const [reason, setReason] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setFormError(null);
    const body = {
      waterLitres: numberOrUndefined(water),
      ...(needsOverride ? { override: { reason } } : {}),
    };
    const parsed = state.acceptFirst
      ? AcceptDropOffSchema.safeParse({ ...body, feedNow: true })
      : FeedDropOffSchema.safeParse(body);
    if (!parsed.success) {
      setErrors(issuesToFields(parsed.error));
      focusFirstInvalid(formRef.current);
      return;
    }
    try {
      await decide(
        state.acceptFirst
          ? { kind: "accept", dropOffId: d.id, body: { ...body, feedNow: true } }
          : { kind: "feed", dropOffId: d.id, body },
      );
      onClose();
    } catch (err) {
      // Without a reason field on screen, "beyond the budget" (someone else took the room) is a message for the whole form.
      const { fields, form } = serverErrors(
        err,
        needsOverride ? ["waterLitres", "override", "override.reason"] : ["waterLitres"],
      );
      setErrors({ ...fields, ...(fields.override ? { "override.reason": fields.override } : {}) });
      setFormError(form);
      focusFirstInvalid(formRef.current);
    }
  };

  return (
    <Dialog
      open
      onClose={onClose}
      title={state.acceptFirst ? `Accept and feed: ${d.householdName}` : `Feed: ${d.householdName}`}
      description={`${amountText(d)}. Mix the scraps with the dilution water and pour them in at the inlet.`}
    >
      <form ref={formRef} noValidate onSubmit={submit} className="flex flex-col gap-4">
        {formError ? (
          <Alert variant="danger" title="Not fed" announce="assertive">
            <p>{formError}</p>
          </Alert>
        ) : null}
        <Field
          label="Dilution water (litres)"
          hint={`Suggested: ${formatNumber(d.suggestedWaterLitres)} L, to bring this mix down to the digester's target solids.`}
          error={errors.waterLitres}
        >
          <Input inputMode="decimal" autoComplete="off" value={water} onChange={(e) => setWater(e.target.value)} />
        </Field>
        {needsOverride ? (
          <Field
            label="Why feed beyond today's budget?"
            hint={overrideHint}
            error={errors["override.reason"] ?? errors.override}
            required
          >
            <Textarea rows={3} value={reason} onChange={(e) => setReason(e.target.value)} />
          </Field>
        ) : null}
        <div className="flex flex-wrap justify-end gap-2">
          <Button type="button" variant="outline" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" loading={pending}>
            {state.acceptFirst ? "Accept and feed" : "Record as fed"}
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

function OverrideDialog({
  state,
  onClose,
  decide,
  pending,
}: Inner<Extract<DecisionDialogState, { type: "override" }>>) {
  const d = state.dropOff;
  const formRef = useRef<HTMLFormElement>(null);
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | undefined>();
  const [formError, setFormError] = useState<string | null>(null);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setFormError(null);
    const parsed = AcceptDropOffSchema.safeParse({ override: { reason } });
    if (!parsed.success) {
      setError(issuesToFields(parsed.error)["override.reason"]);
      focusFirstInvalid(formRef.current);
      return;
    }
    try {
      await decide({ kind: "accept", dropOffId: d.id, body: { override: { reason } } });
      onClose();
    } catch (err) {
      const { fields, form } = serverErrors(err, ["override", "override.reason"]);
      setError(fields["override.reason"] ?? fields.override);
      setFormError(form);
    }
  };

  return (
    <Dialog
      open
      onClose={onClose}
      title={`Accept beyond today's budget: ${d.householdName}`}
      description={`${amountText(d)} does not fit in today's room.`}
    >
      <form ref={formRef} noValidate onSubmit={submit} className="flex flex-col gap-4">
        {formError ? (
          <Alert variant="danger" title="Not accepted" announce="assertive">
            <p>{formError}</p>
          </Alert>
        ) : null}
        <Field label="Why accept it anyway?" hint={overrideHint} error={error} required>
          <Textarea rows={3} value={reason} onChange={(e) => setReason(e.target.value)} />
        </Field>
        <div className="flex flex-wrap justify-end gap-2">
          <Button type="button" variant="outline" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" loading={pending}>
            Accept with this reason
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

function TurnAwayDialog({
  state,
  onClose,
  decide,
  pending,
}: Inner<Extract<DecisionDialogState, { type: "turn-away" }>>) {
  const d = state.dropOff;
  const formRef = useRef<HTMLFormElement>(null);
  const [reason, setReason] = useState<TurnedAwayReason | "">(
    d.fitsToday ? (d.citrusOverLimit ? "too_much_citrus" : "") : "over_budget",
  );
  const [note, setNote] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setFormError(null);
    const body = { reason, note: note.trim() === "" ? undefined : note };
    const parsed = TurnAwayDropOffSchema.safeParse(body);
    if (!parsed.success) {
      setErrors(reason === "" ? { reason: "Choose why it is turned away." } : issuesToFields(parsed.error));
      focusFirstInvalid(formRef.current);
      return;
    }
    try {
      await decide({
        kind: "turn-away",
        dropOffId: d.id,
        body: { reason: reason as TurnedAwayReason, note: body.note },
      });
      onClose();
    } catch (err) {
      const { fields, form } = serverErrors(err, ["reason", "note"]);
      setErrors(fields);
      setFormError(form);
    }
  };

  return (
    <Dialog
      open
      onClose={onClose}
      title={`Turn away: ${d.householdName}`}
      description={`${amountText(d)}. The household sees the reason in its history.`}
    >
      <form ref={formRef} noValidate onSubmit={submit} className="flex flex-col gap-4">
        {formError ? (
          <Alert variant="danger" title="Not turned away" announce="assertive">
            <p>{formError}</p>
          </Alert>
        ) : null}
        <RadioGroup
          legend="Reason"
          required
          value={reason}
          onValueChange={(v) => setReason(v as TurnedAwayReason)}
          error={errors.reason}
          options={TURNED_AWAY_REASONS.map((r) => ({ value: r, label: TURN_AWAY_REASON_CHOICES[r] }))}
        />
        <Field
          label="Note for the household"
          hint={reason === "other" ? "Required for another reason." : "Optional."}
          error={errors.note}
          required={reason === "other"}
        >
          <Textarea rows={3} value={note} onChange={(e) => setNote(e.target.value)} />
        </Field>
        <div className="flex flex-wrap justify-end gap-2">
          <Button type="button" variant="outline" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" variant="danger" loading={pending}>
            Turn away
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
