import { useState } from "react";
import type { RebalanceItem } from "@shared/schemas/assignments";
import { Alert, Button, EmptyState, Select, Table, TableCaption, TBody, TD, TH, THead, TR } from "@/components/ui";
import { useMoveDropOffs, useRebalancing } from "../api/rebalancing";

/**
 * Today's and tomorrow's pending drop-offs at digesters that cannot take them (resting,
 * offline, or less room than what is waiting), each with the nearest digesters that have room;
 * move one, or all to their first suggestion. Residents are told by e-mail.
 */
export function RebalancingPanel() {
  const { data, isPending, error } = useRebalancing();
  const move = useMoveDropOffs();
  const [choice, setChoice] = useState<Record<number, string>>({});
  const [done, setDone] = useState<string | null>(null);

  if (isPending) return <p>Looking at today's drop-offs…</p>;
  if (error)
    return (
      <Alert variant="danger" title="Could not load rebalancing">
        {error.message}
      </Alert>
    );
  const items = data.items;
  const target = (i: RebalanceItem) => Number(choice[i.dropOffId] ?? i.suggestions[0]?.digesterId ?? 0);
  const movable = items.filter((i) => target(i) > 0);
  const run = (moves: { dropOffId: number; digesterId: number }[]) =>
    move.mutate(moves, {
      onSuccess: (r) =>
        setDone(
          `Moved ${r.moved} drop-off${r.moved === 1 ? "" : "s"}; ${r.emailsQueued} resident${r.emailsQueued === 1 ? "" : "s"} told by e-mail.`,
        ),
    });

  return (
    <div className="flex flex-col gap-4">
      {done ? (
        <Alert variant="success" title="Moved">
          {done}
        </Alert>
      ) : null}
      {move.error ? (
        <Alert variant="danger" title="Nothing was moved">
          {move.error.message}
        </Alert>
      ) : null}
      {items.length === 0 ? (
        <EmptyState
          title="Nothing to move"
          description="Every pending drop-off for today and tomorrow fits its digester."
        />
      ) : (
        <>
          <Table label="Drop-offs to move">
            <TableCaption className="sr-only">
              Pending drop-offs at digesters that cannot take them, with where they could go
            </TableCaption>
            <THead>
              <TR>
                <TH>Household</TH>
                <TH>Day</TH>
                <TH>Scraps</TH>
                <TH>Now at</TH>
                <TH>Why</TH>
                <TH>Move to</TH>
                <TH>
                  <span className="sr-only">Action</span>
                </TH>
              </TR>
            </THead>
            <TBody>
              {items.map((i) => (
                <TR key={i.dropOffId}>
                  <TD>{i.householdName}</TD>
                  <TD>{i.forDate}</TD>
                  <TD>{i.freshKg.toFixed(1)} kg</TD>
                  <TD>{i.digesterName}</TD>
                  <TD>{i.why}</TD>
                  <TD>
                    {i.suggestions.length === 0 ? (
                      "No digester has room"
                    ) : (
                      <Select
                        aria-label={`Digester for ${i.householdName}'s drop-off`}
                        className="min-w-64"
                        value={String(target(i))}
                        onChange={(e) => setChoice({ ...choice, [i.dropOffId]: e.target.value })}
                        options={i.suggestions.map((s) => ({
                          value: String(s.digesterId),
                          label: `${s.name} (${s.distanceM} m, room ${s.roomKg} kg)`,
                        }))}
                      />
                    )}
                  </TD>
                  <TD>
                    <Button
                      type="button"
                      size="sm"
                      variant="outline"
                      disabled={target(i) === 0 || move.isPending}
                      onClick={() => run([{ dropOffId: i.dropOffId, digesterId: target(i) }])}
                    >
                      Move<span className="sr-only"> {i.householdName}'s drop-off</span>
                    </Button>
                  </TD>
                </TR>
              ))}
            </TBody>
          </Table>
          <div>
            <Button
              type="button"
              disabled={movable.length === 0}
              loading={move.isPending}
              onClick={() => run(movable.map((i) => ({ dropOffId: i.dropOffId, digesterId: target(i) })))}
            >
              Move all ({movable.length})
            </Button>
          </div>
        </>
      )}
    </div>
  );
}
