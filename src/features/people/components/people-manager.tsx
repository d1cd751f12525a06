import { useCallback, useMemo, useState } from "react";
import { useSuspenseQuery } from "@tanstack/react-query";
import type { PersonRow } from "@shared/schemas/people";
import { Alert, Button, Dialog } from "@/components/ui";
import { digesterNamesQueryOptions } from "../api/get-digester-names";
import { peopleQueryOptions } from "../api/get-people";
import { undeliveredEmailsQueryOptions } from "../api/get-undelivered-emails";
import { EditPersonForm } from "./edit-person-form";
import { InvitePersonForm } from "./invite-person-form";
import { PeopleTable } from "./people-table";
import { UndeliveredEmails } from "./undelivered-emails";

/** The people page's working area: invite, the table, the edit dialog and undelivered e-mail. */
export function PeopleManager({ currentUserId }: { currentUserId: number }) {
  const { data: people } = useSuspenseQuery(peopleQueryOptions());
  const { data: digesters } = useSuspenseQuery(digesterNamesQueryOptions());
  const { data: undelivered } = useSuspenseQuery(undeliveredEmailsQueryOptions());
  const [inviting, setInviting] = useState(false);
  const [editingId, setEditingId] = useState<number | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const digesterNames = useMemo(() => new Map(digesters.map((d) => [d.id, d.name])), [digesters]);
  const editing = people.find((p) => p.id === editingId) ?? null;
  const onEdit = useCallback((person: PersonRow) => setEditingId(person.id), []);

  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-wrap items-center gap-3">
        <Button type="button" onClick={() => setInviting(true)}>
          Invite someone
        </Button>
      </div>
      {notice ? (
        <Alert variant="success" title="Done">
          <p>{notice}</p>
        </Alert>
      ) : null}
      <PeopleTable people={people} digesterNames={digesterNames} onEdit={onEdit} />
      <UndeliveredEmails emails={undelivered} />

      <Dialog
        open={inviting}
        onClose={() => setInviting(false)}
        title="Invite someone"
        description="They get an e-mail with a link that works once, for 7 days."
      >
        {inviting ? (
          <InvitePersonForm
            onCancel={() => setInviting(false)}
            onInvited={(created) => {
              setInviting(false);
              setNotice(
                `Invitation sent to ${created.email}. The link works until ${new Date(created.expiresAt).toLocaleString()}.`,
              );
            }}
          />
        ) : null}
      </Dialog>

      <Dialog
        open={editing !== null}
        onClose={() => setEditingId(null)}
        title={editing ? `Edit ${editing.name}` : "Edit"}
      >
        {editing ? (
          <EditPersonForm
            key={editing.id}
            person={editing}
            people={people}
            digesters={digesters}
            currentUserId={currentUserId}
            onCancel={() => setEditingId(null)}
            onSaved={(message) => {
              setEditingId(null);
              setNotice(message);
            }}
          />
        ) : null}
      </Dialog>
    </div>
  );
}
