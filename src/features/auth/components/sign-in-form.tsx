import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { Link } from "react-router-dom";
import { LoginRequestSchema, type LoginRequest, type SessionUser } from "@shared/schemas/auth";
import { Alert, Button, Field, Input } from "@/components/ui";
import { paths } from "@/config/paths";
import { useSignIn } from "../api/sign-in";
import { applyServerErrors } from "../utils/form-errors";

const formErrorId = "sign-in-error";

/**
 * E-mail and password, with the autocomplete tokens password managers look for. Pasting works
 * (WCAG 3.3.8). A wrong e-mail or password is one message above the form, linked to both fields.
 */
export function SignInForm({ onSignedIn }: { onSignedIn: (user: SessionUser) => void }) {
  const signIn = useSignIn();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<LoginRequest>({ resolver: zodResolver(LoginRequestSchema), defaultValues: { email: "", password: "" } });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      onSignedIn(await signIn.mutateAsync(values));
    } catch (err) {
      setFormError(applyServerErrors(err, setError, ["email", "password"]));
    }
  });

  const describedBy = formError ? formErrorId : undefined;
  return (
    <form onSubmit={onSubmit} noValidate aria-labelledby="sign-in-heading" className="flex max-w-md flex-col gap-5">
      {formError ? (
        <Alert id={formErrorId} variant="danger" title="Not signed in" announce="assertive">
          <p>{formError}</p>
        </Alert>
      ) : null}
      <Field label="E-mail address" error={errors.email?.message} required>
        <Input
          type="email"
          autoComplete="username"
          inputMode="email"
          spellCheck={false}
          aria-describedby={describedBy}
          aria-invalid={formError ? true : undefined}
          {...register("email")}
        />
      </Field>
      <Field label="Password" error={errors.password?.message} required>
        <Input
          type="password"
          autoComplete="current-password"
          aria-describedby={describedBy}
          aria-invalid={formError ? true : undefined}
          {...register("password")}
        />
      </Field>
      <div className="flex flex-wrap items-center gap-4">
        <Button type="submit" loading={signIn.isPending}>
          Sign in
        </Button>
        <Link to={paths.resetPassword()} className="inline-flex min-h-11 items-center underline">
          Forgot your password?
        </Link>
      </div>
    </form>
  );
}
