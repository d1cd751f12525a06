import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import {
  ChangePasswordSchema,
  PASSWORD_MAX_LENGTH,
  PASSWORD_MIN_LENGTH,
  type ChangePassword,
} from "@shared/schemas/auth";
import { Alert, Button, Field, Input } from "@/components/ui";
import { useChangePassword } from "../api/change-password";
import { applyServerErrors } from "../utils/form-errors";

/** Changes the password; every other signed-in device is signed out. */
export function PasswordForm({ email }: { email: string }) {
  const change = useChangePassword();
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<ChangePassword>({
    resolver: zodResolver(ChangePasswordSchema),
    defaultValues: { currentPassword: "", newPassword: "" },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    setSaved(false);
    try {
      await change.mutateAsync(values);
      reset();
      setSaved(true);
    } catch (err) {
      setFormError(applyServerErrors(err, setError, ["currentPassword", "newPassword"]));
    }
  });

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-labelledby="account-password-heading"
      className="flex max-w-md flex-col gap-4"
    >
      <h2 id="account-password-heading" className="text-2xl font-bold">
        Password
      </h2>
      {saved ? (
        <Alert variant="success" title="Password changed">
          <p>Every other device where you were signed in has been signed out.</p>
        </Alert>
      ) : null}
      {formError ? (
        <Alert variant="danger" title="The password was not changed" announce="assertive">
          <p>{formError}</p>
        </Alert>
      ) : null}
      {/* Lets password managers file the new password under the right account. */}
      <input type="email" autoComplete="username" value={email} readOnly hidden />
      <Field label="Current password" error={errors.currentPassword?.message} required>
        <Input type="password" autoComplete="current-password" {...register("currentPassword")} />
      </Field>
      <Field
        label="New password"
        hint={`At least ${PASSWORD_MIN_LENGTH} and at most ${PASSWORD_MAX_LENGTH} characters, anything you like; very common passwords are refused.`}
        error={errors.newPassword?.message}
        required
      >
        <Input type="password" autoComplete="new-password" {...register("newPassword")} />
      </Field>
      <div>
        <Button type="submit" loading={change.isPending}>
          Change password
        </Button>
      </div>
    </form>
  );
}
