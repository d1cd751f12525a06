import type { OutboxEmailRow } from "@shared/schemas/people";
import { Badge, Table, TBody, TD, TH, THead, TR } from "@/components/ui";

/** E-mail that has not arrived: permanent failures first, then messages still being retried. */
export function UndeliveredEmails({ emails }: { emails: OutboxEmailRow[] }) {
  if (emails.length === 0) return null;
  return (
    <section aria-labelledby="undelivered-heading" className="flex flex-col gap-3">
      <h2 id="undelivered-heading" className="text-2xl font-bold">
        E-mail not delivered yet
      </h2>
      <p className="text-muted">
        Failed messages will not be retried: check the address and invite or ask again. Waiting messages are sent or
        retried automatically.
      </p>
      <Table label="E-mail not delivered yet">
        <THead>
          <TR>
            <TH>To</TH>
            <TH>Subject</TH>
            <TH>State</TH>
            <TH>Attempts</TH>
            <TH>Last error</TH>
          </TR>
        </THead>
        <TBody>
          {emails.map((e) => (
            <TR key={e.id}>
              <TD className="break-all">{e.toAddress}</TD>
              <TD>{e.subject}</TD>
              <TD>
                {e.status === "failed" ? (
                  <Badge tone="danger">Failed</Badge>
                ) : e.attempts === 0 ? (
                  <Badge tone="info">Waiting to be sent</Badge>
                ) : (
                  <Badge tone="warning">Waiting to retry</Badge>
                )}
              </TD>
              <TD>{e.attempts}</TD>
              <TD className="break-all">{e.lastError ?? "—"}</TD>
            </TR>
          ))}
        </TBody>
      </Table>
    </section>
  );
}
