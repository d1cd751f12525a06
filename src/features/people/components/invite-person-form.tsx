import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { ROLES } from "@shared/schemas/auth";
import { InvitePersonSchema, type InvitationCreated, type InvitePerson } from "@shared/schemas/people";
import { Alert, Button, Checkbox, Field, FieldError, Input } from "@/components/ui";
import { useInvitePerson } from "../api/invite-person";
import { roleDescriptions, roleLabels } from "../utils/labels";
import { applyServerErrors } from "../utils/form-errors";

/** Invites someone by e-mail with their roles; they get a one-time link valid for 7 days. */
export function InvitePersonForm({
  onInvited,
  onCancel,
}: {
  onInvited: (created: InvitationCreated) => void;
  onCancel: () => void;
}) {
  const invite = useInvitePerson();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<InvitePerson>({
    resolver: zodResolver(InvitePersonSchema),
    defaultValues: { email: "", name: "", roles: ["resident"] },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      onInvited(await invite.mutateAsync(values));
    } catch (err) {
      setFormError(applyServerErrors(err, setError, ["email", "name", "roles"]));
    }
  });

  const rolesError = errors.roles?.message ?? errors.roles?.root?.message;
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Invite someone" className="flex flex-col gap-4">
      {formError ? (
        <Alert variant="danger" title="No invitation sent" announce="assertive">
          <p>{formError}</p>
        </Alert>
      ) : null}
      <Field label="E-mail address" error={errors.email?.message} required>
        <Input type="email" autoComplete="off" inputMode="email" spellCheck={false} {...register("email")} />
      </Field>
      <Field label="Name" hint="Optional; they can change it when they accept." error={errors.name?.message}>
        <Input autoComplete="off" {...register("name")} />
      </Field>
      <fieldset className="flex flex-col gap-1" aria-describedby={rolesError ? "invite-roles-error" : undefined}>
        <legend className="mb-1 font-bold">Roles</legend>
        {ROLES.map((role) => (
          <Checkbox
            key={role}
            label={roleLabels[role]}
            hint={roleDescriptions[role]}
            value={role}
            {...register("roles")}
          />
        ))}
        {rolesError ? <FieldError id="invite-roles-error">{rolesError}</FieldError> : null}
      </fieldset>
      <div className="flex flex-wrap justify-end gap-2">
        <Button type="button" variant="outline" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" loading={invite.isPending}>
          Send invitation
        </Button>
      </div>
    </form>
  );
}
