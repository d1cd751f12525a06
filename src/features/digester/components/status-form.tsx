import { useRef, useState, type FormEvent } from "react";
import { SetDigesterStatusSchema, type DigesterProfile, type DigesterStatus } from "@shared/schemas/digester";
import { Alert, Button, Field, RadioGroup, Textarea } from "@/components/ui";
import { ApiError } from "@/lib/api-client";
import { useSetStatus } from "../api/set-status";

const options: { value: DigesterStatus; label: string; description: string }[] = [
  { value: "active", label: "Active", description: "Takes drop-offs within its feed budget." },
  {
    value: "resting",
    label: "Resting",
    description: "Takes no drop-offs, e.g. while it recovers from acidity or in a cold spell.",
  },
  { value: "offline", label: "Offline", description: "Out of use (repairs, emptying). Takes no drop-offs." },
];

/** Active, resting or offline, with the reason households and other stewards see. */
export function StatusForm({ profile, onChanged }: { profile: DigesterProfile; onChanged?: () => void }) {
  const update = useSetStatus(profile.id, onChanged);
  const formRef = useRef<HTMLFormElement>(null);
  const [status, setStatus] = useState<DigesterStatus>(profile.status);
  const [reason, setReason] = useState(profile.statusReason ?? "");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setFormError(null);
    setSaved(null);
    const body = { status, reason: status === "active" ? null : reason };
    const parsed = SetDigesterStatusSchema.safeParse(body);
    if (!parsed.success) {
      setErrors(
        Object.fromEntries(parsed.error.issues.map((i) => [i.path.map(String).join(".") || "form", i.message])),
      );
      requestAnimationFrame(() => formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
      return;
    }
    setErrors({});
    try {
      const after = await update.mutateAsync({ id: profile.id, body });
      setSaved(
        after.status === "active"
          ? "The digester is active and takes drop-offs again."
          : `The digester is ${after.status}: it takes no drop-offs.`,
      );
    } catch (err) {
      if (err instanceof ApiError && Object.keys(err.fields).length > 0) setErrors(err.fields);
      else setFormError(err instanceof ApiError ? err.message : "Something went wrong. Please try again.");
    }
  };

  return (
    <form
      ref={formRef}
      noValidate
      onSubmit={submit}
      aria-label="Digester status"
      className="flex max-w-2xl flex-col gap-4"
    >
      {saved ? <Alert variant="success" title={saved} /> : null}
      {formError ? (
        <Alert variant="danger" title="The status was not changed" announce="assertive">
          <p>{formError}</p>
        </Alert>
      ) : null}
      <RadioGroup
        legend="Is the digester taking scraps?"
        value={status}
        onValueChange={(s) => setStatus(s as DigesterStatus)}
        options={options}
        error={errors.status}
        layout="grid"
      />
      {status !== "active" ? (
        <Field label="Reason" hint="Households see it on the map." error={errors.reason} required>
          <Textarea rows={2} value={reason} onChange={(e) => setReason(e.target.value)} />
        </Field>
      ) : null}
      <div>
        <Button type="submit" loading={update.isPending}>
          Save status
        </Button>
      </div>
    </form>
  );
}
