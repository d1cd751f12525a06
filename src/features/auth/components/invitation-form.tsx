import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import {
  AcceptInvitationSchema,
  type AcceptInvitation,
  type InvitationInfo,
  type SessionUser,
} from "@shared/schemas/auth";
import { Alert, Button, Field, Input } from "@/components/ui";
import { useAcceptInvitation } from "../api/accept-invitation";
import { applyServerErrors } from "../utils/form-errors";
import { passwordHint } from "./new-password-form";

/** Accepts an invitation: the person's name and a password; then they are signed in. */
export function InvitationForm({
  token,
  invitation,
  onAccepted,
}: {
  token: string;
  invitation: InvitationInfo;
  onAccepted: (user: SessionUser) => void;
}) {
  const accept = useAcceptInvitation(token);
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<AcceptInvitation>({
    resolver: zodResolver(AcceptInvitationSchema),
    defaultValues: { name: invitation.name, password: "" },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      onAccepted(await accept.mutateAsync(values));
    } catch (err) {
      setFormError(applyServerErrors(err, setError, ["name", "password"]));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Accept the invitation" className="flex max-w-md flex-col gap-5">
      {formError ? (
        <Alert variant="danger" title="The invitation was not accepted" announce="assertive">
          <p>{formError}</p>
        </Alert>
      ) : null}
      <Field label="E-mail address" hint="You sign in with this address. A coordinator can change it later.">
        <Input type="email" autoComplete="username" value={invitation.email} readOnly />
      </Field>
      <Field
        label="Your name"
        hint="As your neighbours know you; others in the group see it."
        error={errors.name?.message}
        required
      >
        <Input autoComplete="name" {...register("name")} />
      </Field>
      <Field label="Choose a password" hint={passwordHint} error={errors.password?.message} required>
        <Input type="password" autoComplete="new-password" {...register("password")} />
      </Field>
      <div>
        <Button type="submit" loading={accept.isPending}>
          Accept and sign in
        </Button>
      </div>
    </form>
  );
}
