import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { UpdateAccountSchema, type SessionUser, type UpdateAccount } from "@shared/schemas/auth";
import { Alert, Button, Field, Input } from "@/components/ui";
import { useUpdateName } from "../api/update-name";
import { applyServerErrors } from "../utils/form-errors";

export function NameForm({ user, onUpdated }: { user: SessionUser; onUpdated: (user: SessionUser) => void }) {
  const update = useUpdateName(onUpdated);
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<UpdateAccount>({ resolver: zodResolver(UpdateAccountSchema), defaultValues: { name: user.name } });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    setSaved(false);
    try {
      await update.mutateAsync(values);
      setSaved(true);
    } catch (err) {
      setFormError(applyServerErrors(err, setError, ["name"]));
    }
  });

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-labelledby="account-name-heading"
      className="flex max-w-md flex-col gap-4"
    >
      <h2 id="account-name-heading" className="text-2xl font-bold">
        Your name
      </h2>
      {saved ? <Alert variant="success" title="Name saved" /> : null}
      {formError ? (
        <Alert variant="danger" title="The name was not saved" announce="assertive">
          <p>{formError}</p>
        </Alert>
      ) : null}
      <Field label="Name" hint="Others in the group see this name." error={errors.name?.message} required>
        <Input autoComplete="name" {...register("name")} />
      </Field>
      <div>
        <Button type="submit" loading={update.isPending}>
          Save name
        </Button>
      </div>
    </form>
  );
}
