import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { PasswordResetRequestSchema, type PasswordResetRequest } from "@shared/schemas/auth";
import { Alert, Button, Field, Input } from "@/components/ui";
import { useRequestPasswordReset } from "../api/request-password-reset";
import { applyServerErrors } from "../utils/form-errors";

/** Asks for a reset link; the answer is the same whether or not the address has an account. */
export function RequestResetForm() {
  const request = useRequestPasswordReset();
  const [formError, setFormError] = useState<string | null>(null);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<PasswordResetRequest>({
    resolver: zodResolver(PasswordResetRequestSchema),
    defaultValues: { email: "" },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await request.mutateAsync(values);
      setSentTo(values.email);
    } catch (err) {
      setFormError(applyServerErrors(err, setError, ["email"]));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Ask for a reset link" className="flex max-w-md flex-col gap-5">
      {sentTo ? (
        <Alert variant="success" title="Check your e-mail">
          <p>
            If an account uses {sentTo}, we have sent it a link to choose a new password. The link works once, for one
            hour.
          </p>
        </Alert>
      ) : null}
      {formError ? (
        <Alert variant="danger" title="The link was not sent" announce="assertive">
          <p>{formError}</p>
        </Alert>
      ) : null}
      <Field label="E-mail address" error={errors.email?.message} required>
        <Input type="email" autoComplete="email" inputMode="email" spellCheck={false} {...register("email")} />
      </Field>
      <div>
        <Button type="submit" loading={request.isPending}>
          Send me a reset link
        </Button>
      </div>
    </form>
  );
}
