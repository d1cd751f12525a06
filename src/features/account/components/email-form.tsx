import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { ChangeEmailSchema, type ChangeEmail, type SessionUser } from "@shared/schemas/auth";
import { Alert, Button, Field, Input } from "@/components/ui";
import { useChangeEmail } from "../api/change-email";
import { applyServerErrors } from "../utils/form-errors";

/** Shows where sign-in and notifications go, and changes it after asking for the password again. */
export function EmailForm({ user, onUpdated }: { user: SessionUser; onUpdated: (user: SessionUser) => void }) {
  const change = useChangeEmail(onUpdated);
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<ChangeEmail>({ resolver: zodResolver(ChangeEmailSchema), defaultValues: { newEmail: "", password: "" } });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    setSaved(false);
    try {
      await change.mutateAsync(values);
      reset();
      setSaved(true);
    } catch (err) {
      setFormError(applyServerErrors(err, setError, ["newEmail", "password"]));
    }
  });

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-labelledby="account-email-heading"
      className="flex max-w-md flex-col gap-4"
    >
      <h2 id="account-email-heading" className="text-2xl font-bold">
        E-mail address
      </h2>
      <p>
        You sign in with, and notifications go to: <strong className="break-all">{user.email}</strong>
      </p>
      {saved ? (
        <Alert variant="success" title="E-mail address changed">
          <p>We told your previous address about the change.</p>
        </Alert>
      ) : null}
      {formError ? (
        <Alert variant="danger" title="The address was not changed" announce="assertive">
          <p>{formError}</p>
        </Alert>
      ) : null}
      <Field label="New e-mail address" error={errors.newEmail?.message} required>
        <Input type="email" autoComplete="email" inputMode="email" spellCheck={false} {...register("newEmail")} />
      </Field>
      <Field label="Your current password" hint="To make sure it is you." error={errors.password?.message} required>
        <Input type="password" autoComplete="current-password" {...register("password")} />
      </Field>
      <div>
        <Button type="submit" loading={change.isPending}>
          Change e-mail address
        </Button>
      </div>
    </form>
  );
}
