import { useRef, useState, type FormEvent } from "react";
import { AddMemberSchema, type Household, type MemberAdded } from "@shared/schemas/households";
import {
  Alert,
  Badge,
  Button,
  Card,
  CardContent,
  CardDescription,
  CardHeader,
  CardTitle,
  Field,
  Input,
} from "@/components/ui";
import { useAddMember } from "../api/add-member";
import { focusFirstInvalid, serverFieldErrors, zodFieldErrors, type FieldErrors } from "@/lib/form";

/** Who belongs to the household, and a form to invite another member by e-mail. */
export function MembersCard({ household }: { household: Household }) {
  const formRef = useRef<HTMLFormElement>(null);
  const add = useAddMember();
  const [email, setEmail] = useState("");
  const [name, setName] = useState("");
  const [errors, setErrors] = useState<FieldErrors>({});
  const [sent, setSent] = useState<MemberAdded | null>(null);

  const onSubmit = async (event: FormEvent) => {
    event.preventDefault();
    setSent(null);
    const parsed = AddMemberSchema.safeParse({ email, name });
    if (!parsed.success) {
      setErrors(zodFieldErrors(parsed.error));
      focusFirstInvalid(formRef.current);
      return;
    }
    setErrors({});
    try {
      setSent(await add.mutateAsync(parsed.data));
      setEmail("");
      setName("");
    } catch (err) {
      setErrors(serverFieldErrors(err, ["email", "name"]));
      focusFirstInvalid(formRef.current);
    }
  };

  return (
    <Card>
      <CardHeader>
        <CardTitle>Members</CardTitle>
        <CardDescription>Everyone here can log drop-offs for the household and sees its history.</CardDescription>
      </CardHeader>
      <CardContent className="flex flex-col gap-6">
        <ul className="flex flex-col gap-2">
          {household.members.map((m) => (
            <li key={m.id} className="flex flex-wrap items-center gap-2">
              <span className="font-bold">{m.name}</span>
              {m.isYou ? <span className="text-muted">(you)</span> : null}
              {m.status === "invited" ? <Badge tone="info">Invited, not joined yet</Badge> : null}
              {m.status === "disabled" ? <Badge tone="danger">Account disabled</Badge> : null}
            </li>
          ))}
        </ul>
        <form ref={formRef} onSubmit={onSubmit} noValidate aria-label="Invite a member" className="flex flex-col gap-4">
          <h3 className="text-lg font-bold">Invite someone who lives with you</h3>
          {errors.form ? (
            <Alert variant="danger" title="No invitation sent" announce="assertive">
              <p>{errors.form}</p>
            </Alert>
          ) : null}
          {sent ? (
            <Alert variant="success" title="Invitation sent">
              <p>
                We e-mailed {sent.email} a link to join. It works until{" "}
                {new Date(sent.expiresAt).toLocaleDateString("en-GB", { day: "numeric", month: "long" })}.
              </p>
            </Alert>
          ) : null}
          <Field label="Their e-mail address" error={errors.email} required>
            <Input
              type="email"
              inputMode="email"
              autoComplete="off"
              spellCheck={false}
              value={email}
              onChange={(e) => setEmail(e.target.value)}
            />
          </Field>
          <Field label="Their name" hint="Optional; they can change it when they join." error={errors.name}>
            <Input autoComplete="off" value={name} onChange={(e) => setName(e.target.value)} />
          </Field>
          <div>
            <Button type="submit" variant="outline" loading={add.isPending}>
              Send invitation
            </Button>
          </div>
        </form>
      </CardContent>
    </Card>
  );
}
