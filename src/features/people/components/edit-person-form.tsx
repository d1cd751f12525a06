import { useState } from "react";
import { useForm } from "react-hook-form";
import { ROLES, type Role } from "@shared/schemas/auth";
import { UpdatePersonSchema, type PersonRow, type UpdatePerson } from "@shared/schemas/people";
import { Alert, Button, Checkbox, Field, FieldError, Input, RadioGroup } from "@/components/ui";
import { ApiError } from "@/lib/api-client";
import { useInvitePerson } from "../api/invite-person";
import { useSetStewards } from "../api/set-stewards";
import { useUpdatePerson } from "../api/update-person";
import { roleDescriptions, roleLabels } from "../utils/labels";

type Values = {
  roles: Role[];
  status: "active" | "disabled" | "invited";
  isVolunteer: boolean;
  bikeLoadKg: string;
  digesterIds: string[];
};

export type EditPersonFormProps = {
  person: PersonRow;
  /** Everyone, to know each digester's other stewards. */
  people: PersonRow[];
  digesters: Array<{ id: number; name: string }>;
  currentUserId: number;
  onSaved: (message: string) => void;
  onCancel: () => void;
};

/**
 * Roles, status (disabling signs the person out everywhere at once), volunteer details and the
 * digesters a steward looks after. Checked with the shared UpdatePerson schema before sending.
 */
export function EditPersonForm({ person, people, digesters, currentUserId, onSaved, onCancel }: EditPersonFormProps) {
  const update = useUpdatePerson();
  const setStewards = useSetStewards();
  const reinvite = useInvitePerson();
  const [formError, setFormError] = useState<string | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const isSelf = person.id === currentUserId;
  const { register, handleSubmit, watch, setValue } = useForm<Values>({
    defaultValues: {
      roles: person.roles,
      status: person.status,
      isVolunteer: person.isVolunteer,
      bikeLoadKg: person.bikeLoadKg === null ? "" : String(person.bikeLoadKg),
      digesterIds: person.stewardOf.map(String),
    },
  });
  const roles = watch("roles") ?? [];
  const isVolunteer = watch("isVolunteer");
  const status = watch("status");

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    setFieldErrors({});
    const body: UpdatePerson = {
      roles: values.roles,
      isVolunteer: values.isVolunteer,
      bikeLoadKg: values.isVolunteer && values.bikeLoadKg.trim() !== "" ? Number(values.bikeLoadKg) : null,
      ...(values.status !== "invited" && values.status !== person.status ? { status: values.status } : {}),
    };
    const parsed = UpdatePersonSchema.safeParse(body);
    if (!parsed.success) {
      const errors: Record<string, string> = {};
      for (const issue of parsed.error.issues) errors[String(issue.path[0] ?? "form")] ??= issue.message;
      setFieldErrors(errors);
      return;
    }
    try {
      await update.mutateAsync({ id: person.id, body: parsed.data });
      const isSteward = values.roles.includes("steward");
      const wanted = new Set(isSteward ? values.digesterIds.map(Number) : []);
      const had = new Set(person.stewardOf);
      // Losing the steward role already ended every stewardship on the server.
      const changed = isSteward ? digesters.filter((d) => wanted.has(d.id) !== had.has(d.id)) : [];
      for (const digester of changed) {
        const others = people.filter((p) => p.id !== person.id && p.stewardOf.includes(digester.id)).map((p) => p.id);
        await setStewards.mutateAsync({
          digesterId: digester.id,
          personIds: wanted.has(digester.id) ? [...others, person.id] : others,
        });
      }
      onSaved(`Saved the changes to ${person.name}.`);
    } catch (err) {
      if (err instanceof ApiError) {
        setFieldErrors(err.fields);
        setFormError(err.message);
      } else setFormError("Something went wrong. Please try again.");
    }
  });

  const sendAgain = async () => {
    setFormError(null);
    try {
      await reinvite.mutateAsync({ email: person.email, roles: roles.length ? roles : person.roles });
      onSaved(`Sent ${person.email} a new invitation link.`);
    } catch (err) {
      setFormError(err instanceof ApiError ? err.message : "The invitation was not sent.");
    }
  };

  return (
    <form onSubmit={onSubmit} noValidate aria-label={`Edit ${person.name}`} className="flex flex-col gap-5">
      {formError ? (
        <Alert variant="danger" title="Not saved" announce="assertive">
          <p>{formError}</p>
        </Alert>
      ) : null}
      <p className="break-all">
        <span className="font-bold">E-mail: </span>
        {person.email}
      </p>
      <fieldset className="flex flex-col gap-1" aria-describedby={fieldErrors.roles ? "edit-roles-error" : undefined}>
        <legend className="mb-1 font-bold">Roles</legend>
        {ROLES.map((role) => (
          <Checkbox
            key={role}
            label={roleLabels[role]}
            hint={
              isSelf && role === "coordinator" ? "You cannot remove your own coordinator role." : roleDescriptions[role]
            }
            value={role}
            disabled={isSelf && role === "coordinator"}
            {...register("roles")}
          />
        ))}
        {fieldErrors.roles ? <FieldError id="edit-roles-error">{fieldErrors.roles}</FieldError> : null}
      </fieldset>

      {roles.includes("steward") ? (
        <fieldset
          className="flex flex-col gap-1"
          aria-describedby={fieldErrors.personIds ? "edit-digesters-error" : undefined}
        >
          <legend className="mb-1 font-bold">Looks after these digesters</legend>
          {digesters.length === 0 ? <p className="text-muted">There are no digesters yet.</p> : null}
          {digesters.map((d) => (
            <Checkbox key={d.id} label={d.name} value={String(d.id)} {...register("digesterIds")} />
          ))}
          {fieldErrors.personIds ? <FieldError id="edit-digesters-error">{fieldErrors.personIds}</FieldError> : null}
        </fieldset>
      ) : null}

      {person.status === "invited" ? (
        <div className="flex flex-col gap-2">
          <p>
            <span className="font-bold">Status: </span>Invited; they become active when they accept
            {person.invitationExpiresAt
              ? ` (the link works until ${new Date(person.invitationExpiresAt).toLocaleString()})`
              : ""}
            .
          </p>
          <div>
            <Button type="button" variant="outline" loading={reinvite.isPending} onClick={sendAgain}>
              Send a new invitation link
            </Button>
          </div>
        </div>
      ) : (
        <RadioGroup
          legend="Status"
          value={status}
          onValueChange={(v) => setValue("status", v as Values["status"])}
          error={fieldErrors.status}
          options={[
            { value: "active", label: "Active", description: "Can sign in." },
            {
              value: "disabled",
              label: "Disabled",
              description: isSelf ? "You cannot disable yourself." : "Cannot sign in; any open session ends at once.",
              disabled: isSelf,
            },
          ]}
        />
      )}

      <Checkbox label="Volunteers to collect scraps by cargo bike" {...register("isVolunteer")} />
      {isVolunteer ? (
        <Field label="Load their bike can carry (kg)" error={fieldErrors.bikeLoadKg}>
          <Input type="number" inputMode="decimal" min={1} max={500} step="any" {...register("bikeLoadKg")} />
        </Field>
      ) : null}

      <div className="flex flex-wrap justify-end gap-2">
        <Button type="button" variant="outline" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" loading={update.isPending || setStewards.isPending}>
          Save changes
        </Button>
      </div>
    </form>
  );
}
