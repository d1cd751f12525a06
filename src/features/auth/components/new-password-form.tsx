import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import {
  PASSWORD_MAX_LENGTH,
  PASSWORD_MIN_LENGTH,
  PasswordResetCompleteSchema,
  type PasswordResetComplete,
} from "@shared/schemas/auth";
import { Alert, Button, Field, Input } from "@/components/ui";
import { useResetPassword } from "../api/reset-password";
import { applyServerErrors } from "../utils/form-errors";

export const passwordHint = `At least ${PASSWORD_MIN_LENGTH} and at most ${PASSWORD_MAX_LENGTH} characters. Any characters work; a few unrelated words are easy to remember and hard to guess. Very common passwords are refused.`;

/** Sets a new password from a reset link (the username field helps password managers save it). */
export function NewPasswordForm({ token, onDone }: { token: string; onDone: () => void }) {
  const reset = useResetPassword(token);
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<PasswordResetComplete>({
    resolver: zodResolver(PasswordResetCompleteSchema),
    defaultValues: { password: "" },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await reset.mutateAsync(values);
      onDone();
    } catch (err) {
      setFormError(applyServerErrors(err, setError, ["password"]));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Choose a new password" className="flex max-w-md flex-col gap-5">
      {formError ? (
        <Alert variant="danger" title="The password was not changed" announce="assertive">
          <p>{formError}</p>
        </Alert>
      ) : null}
      <Field label="New password" hint={passwordHint} error={errors.password?.message} required>
        <Input type="password" autoComplete="new-password" {...register("password")} />
      </Field>
      <div>
        <Button type="submit" loading={reset.isPending}>
          Save the new password
        </Button>
      </div>
    </form>
  );
}
