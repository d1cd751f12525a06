import { lazy, Suspense, useMemo, useState } from "react";
import {
  createColumnHelper,
  createSortedRowModel,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_text,
  tableFeatures,
  useTable,
} from "@tanstack/react-table";
import { type Proposal, type ProposalAssignment, ProposalRequestSchema } from "@shared/schemas/assignments";
import { methodWords, proposalNoteWords, suggestionWords, unplacedWords } from "@shared/words/assignment-board";
import {
  Alert,
  Badge,
  Button,
  Card,
  CardContent,
  CardHeader,
  CardTitle,
  Checkbox,
  Dialog,
  EmptyState,
  Field,
  Input,
  Progress,
  Stat,
  Table,
  TableCaption,
  TBody,
  TD,
  TR,
} from "@/components/ui";
import { ApiError } from "@/lib/api-client";
import { useApplyProposal } from "../api/apply";
import { usePropose } from "../api/propose";
import { SortableHead } from "@/components/data-table/sortable-head";

const ProposalMap = lazy(async () => ({ default: (await import("./proposal-map")).ProposalMap }));

const features = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text },
});
const helper = createColumnHelper<typeof features, ProposalAssignment>();

const km = (m: number) => (m >= 1000 ? `${(m / 1000).toFixed(2)} km` : `${Math.round(m)} m`);
const kg1 = (x: number) => `${x.toFixed(1)} kg`;

/**
 * The coordinator's assignment board: run a proposal (nothing changes), see it as a map and as
 * a table of changes against today's assignment, pin or unpin households, exclude digesters,
 * then apply after a confirmation. Pins and exclusions are part of the next proposal.
 */
export function AssignmentBoard() {
  const [maxWalk, setMaxWalk] = useState("");
  const [walkError, setWalkError] = useState<string | null>(null);
  const [excluded, setExcluded] = useState<number[]>([]);
  const [pins, setPins] = useState<Map<number, number>>(new Map());
  const [unpins, setUnpins] = useState<number[]>([]);
  const [onlyChanges, setOnlyChanges] = useState(true);
  const [confirming, setConfirming] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  const propose = usePropose();
  const apply = useApplyProposal();
  const proposal = propose.data;

  const run = (next?: { excluded?: number[]; pins?: Map<number, number>; unpins?: number[] }) => {
    setDone(null);
    apply.reset();
    // The same rule as the server's (ProposalRequestSchema): empty, or metres above 0 and up to 50 km.
    const text = maxWalk.trim().replace(",", ".");
    let walk: number | null = null;
    if (text !== "") {
      const parsed = ProposalRequestSchema.shape.maxWalkM.safeParse(Number(text));
      if (!parsed.success) {
        setWalkError(parsed.error.issues[0]?.message ?? "Give the longest walk in metres, or leave it empty.");
        return;
      }
      walk = parsed.data ?? null;
    }
    setWalkError(null);
    propose.mutate({
      maxWalkM: walk,
      excludeDigesterIds: next?.excluded ?? excluded,
      pins: [...(next?.pins ?? pins).entries()].map(([householdId, digesterId]) => ({ householdId, digesterId })),
      unpins: next?.unpins ?? unpins,
    });
  };

  const togglePin = (a: ProposalAssignment) => {
    const nextPins = new Map(pins);
    let nextUnpins = unpins;
    if (a.pinned) {
      nextPins.delete(a.householdId);
      nextUnpins = [...unpins, a.householdId];
    } else {
      nextPins.set(a.householdId, a.toDigesterId);
      nextUnpins = unpins.filter((id) => id !== a.householdId);
    }
    setPins(nextPins);
    setUnpins(nextUnpins);
    run({ pins: nextPins, unpins: nextUnpins });
  };

  const toggleExcluded = (id: number) => {
    const next = excluded.includes(id) ? excluded.filter((x) => x !== id) : [...excluded, id];
    setExcluded(next);
    run({ excluded: next });
  };

  const names = useMemo(() => new Map((proposal?.digesters ?? []).map((d) => [d.id, d.name])), [proposal]);
  const changes = useMemo(() => (proposal?.assignments ?? []).filter((a) => a.changed), [proposal]);
  const rows = useMemo(() => (onlyChanges ? changes : (proposal?.assignments ?? [])), [onlyChanges, changes, proposal]);

  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor("householdName", { header: "Household", sortFn: "text" }),
        helper.accessor(
          (a) => (a.fromDigesterId === null ? "—" : (names.get(a.fromDigesterId) ?? `Digester ${a.fromDigesterId}`)),
          {
            id: "from",
            header: "Today",
            sortFn: "text",
          },
        ),
        helper.accessor((a) => names.get(a.toDigesterId) ?? `Digester ${a.toDigesterId}`, {
          id: "to",
          header: "Proposed",
          sortFn: "text",
          cell: (info) => (
            <span className="flex flex-wrap items-center gap-2">
              {info.getValue()}
              {info.row.original.changed && info.row.original.fromDigesterId !== info.row.original.toDigesterId ? (
                <Badge tone="primary">Moves</Badge>
              ) : null}
            </span>
          ),
        }),
        helper.accessor("distanceM", { header: "Walk", sortFn: "alphanumeric", cell: (info) => km(info.getValue()) }),
        helper.accessor("weeklyKg", {
          header: "Scraps a week",
          sortFn: "alphanumeric",
          cell: (info) => kg1(info.getValue()),
        }),
        helper.display({
          id: "pin",
          header: "Pin",
          cell: (info) => {
            const a = info.row.original;
            return (
              <Button
                type="button"
                size="sm"
                variant={a.pinned ? "secondary" : "outline"}
                onClick={() => togglePin(a)}
                disabled={propose.isPending}
              >
                {a.pinned ? "Unpin" : "Pin"}
                <span className="sr-only">
                  {" "}
                  {a.householdName} {a.pinned ? "" : `to ${names.get(a.toDigesterId) ?? ""}`}
                </span>
              </Button>
            );
          },
        }),
      ]),
    // togglePin reads the latest pins through state on each render.
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [names, propose.isPending, pins, unpins],
  );

  const table = useTable({
    features,
    columns,
    data: rows,
    initialState: { sorting: [{ id: "householdName", desc: false }] },
  });

  const confirmApply = () => {
    if (!proposal) return;
    apply.mutate(
      {
        version: proposal.version,
        changes: changes.map((a) => ({ householdId: a.householdId, digesterId: a.toDigesterId, pinned: a.pinned })),
      },
      {
        onSuccess: (result) => {
          setConfirming(false);
          setDone(
            `Applied ${result.applied} change${result.applied === 1 ? "" : "s"}; ${result.emailsQueued} e-mail${result.emailsQueued === 1 ? "" : "s"} on the way to the residents who move.`,
          );
          setPins(new Map());
          setUnpins([]);
          propose.reset();
        },
        onError: () => setConfirming(false),
      },
    );
  };
  const moving = changes.filter((a) => a.fromDigesterId !== a.toDigesterId).length;

  return (
    <div className="flex flex-col gap-6">
      <form
        className="flex flex-wrap items-end gap-4"
        onSubmit={(e) => {
          e.preventDefault();
          run();
        }}
      >
        <Field
          label="Longest walk allowed (metres, optional)"
          hint="Leave empty for no limit."
          error={walkError ?? (propose.error instanceof ApiError ? propose.error.fields.maxWalkM : undefined)}
          className="w-72"
        >
          <Input inputMode="numeric" value={maxWalk} onChange={(e) => setMaxWalk(e.target.value)} autoComplete="off" />
        </Field>
        <Button type="submit" loading={propose.isPending}>
          {proposal ? "Run the proposal again" : "Run a proposal"}
        </Button>
      </form>
      <p className="text-muted">
        Nothing changes until you apply. Pins and excluded digesters are used by the next proposal.
      </p>

      {done ? (
        <Alert variant="success" title="Assignments changed">
          {done}
        </Alert>
      ) : null}
      {propose.error ? (
        <Alert variant="danger" title="The proposal could not be made">
          {propose.error.message}
        </Alert>
      ) : null}
      {apply.error ? (
        <Alert
          variant="danger"
          title={
            apply.error instanceof ApiError && apply.error.status === 409 ? "The assignment changed" : "Could not apply"
          }
        >
          {apply.error.message}
        </Alert>
      ) : null}

      {proposal ? <ProposalView proposal={proposal} excluded={excluded} onToggleExcluded={toggleExcluded} /> : null}

      {proposal ? (
        <section aria-labelledby="changes-heading" className="flex flex-col gap-3">
          <div className="flex flex-wrap items-center justify-between gap-3">
            <h2 id="changes-heading" className="text-2xl font-bold">
              Changes against today ({changes.length})
            </h2>
            <Checkbox
              label="Show only households that change"
              checked={onlyChanges}
              onChange={(e) => setOnlyChanges(e.target.checked)}
            />
          </div>
          {rows.length === 0 ? (
            <EmptyState title="No changes" description="Today's assignment is already the best the scheduler found." />
          ) : (
            <Table label="Households and their proposed digesters">
              <TableCaption className="sr-only">
                Each household, today's digester, the proposed one, the walk and the weekly scraps
              </TableCaption>
              <SortableHead
                groups={table.getHeaderGroups()}
                render={(header) => <table.FlexRender header={header} />}
              />
              <TBody>
                {table.getRowModel().rows.map((row) => (
                  <TR key={row.id}>
                    {row.getAllCells().map((cell) => (
                      <TD key={cell.id}>
                        <table.FlexRender cell={cell} />
                      </TD>
                    ))}
                  </TR>
                ))}
              </TBody>
            </Table>
          )}
          <div className="flex flex-wrap gap-3">
            <Button
              type="button"
              onClick={() => setConfirming(true)}
              disabled={changes.length === 0 || propose.isPending}
            >
              Apply {changes.length} change{changes.length === 1 ? "" : "s"}
            </Button>
          </div>
        </section>
      ) : null}

      <Dialog
        open={confirming}
        onClose={() => setConfirming(false)}
        title="Apply this proposal?"
        description={`${changes.length} household${changes.length === 1 ? "" : "s"} change; ${moving} move to another digester and their residents get an e-mail saying where and why.`}
        footer={
          <>
            <Button type="button" onClick={confirmApply} loading={apply.isPending}>
              Apply changes
            </Button>
            <Button type="button" variant="secondary" onClick={() => setConfirming(false)}>
              Cancel
            </Button>
          </>
        }
      />
    </div>
  );
}

function ProposalView({
  proposal,
  excluded,
  onToggleExcluded,
}: {
  proposal: Proposal;
  excluded: number[];
  onToggleExcluded: (id: number) => void;
}) {
  const gap =
    proposal.gapToLpBound === null
      ? "Best found"
      : `At most ${(proposal.gapToLpBound * 100).toFixed(2)} % longer than the best possible`;
  return (
    <>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <Stat label="Total walk, proposed" value={km(proposal.totalDistanceM)} />
        <Stat
          label="Total walk, today"
          value={km(proposal.currentDistanceM)}
          hint="Only households that have a digester today."
        />
        <Stat
          label="Nearest-with-room rule"
          value={km(proposal.baselineDistanceM)}
          hint="The obvious plan, for comparison."
        />
        <Stat
          label="Solver"
          value={proposal.provenOptimal ? "Proven best" : gap}
          hint={`${methodWords(proposal.method)}; ${(proposal.solveMs / 1000).toFixed(1)} s`}
        />
      </div>
      {proposal.notes.length > 0 ? (
        <Alert variant="warning" title="Worth knowing about this proposal">
          <ul className="list-disc pl-5">
            {proposal.notes.map((note, i) => (
              <li key={i}>{proposalNoteWords(note)}</li>
            ))}
          </ul>
        </Alert>
      ) : null}
      {proposal.unplaced.length > 0 ? (
        <section aria-labelledby="unplaced-heading">
          <h2 id="unplaced-heading" className="mb-2 text-2xl font-bold">
            Not placed ({proposal.unplaced.length})
          </h2>
          <p className="mb-2 text-muted">Applying leaves these households as they are today.</p>
          <ul className="flex flex-col gap-2">
            {proposal.unplaced.map((u) => (
              <li key={u.householdId} className="rounded-md border border-border bg-surface p-3">
                <p className="font-bold">{u.householdName}</p>
                <p>{unplacedWords(u)}</p>
                <p className="text-muted">{suggestionWords(u)}</p>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      <div className="grid gap-6">
        <Suspense fallback={<p>Loading the map…</p>}>
          <ProposalMap proposal={proposal} />
        </Suspense>
        <Card>
          <CardHeader>
            <CardTitle>Digesters this week</CardTitle>
            <p className="text-base text-muted">{proposal.weeklyRoomMethod}</p>
          </CardHeader>
          <CardContent>
            <ul className="grid gap-4 sm:grid-cols-2">
              {proposal.digesters.map((d) => (
                <li key={d.id} className="flex flex-col gap-3">
                  <Progress
                    label={d.name}
                    value={d.roomKg > 0 ? d.loadKg : 0}
                    max={d.roomKg > 0 ? d.roomKg : 1}
                    valueText={
                      d.roomKg > 0
                        ? `${kg1(d.loadKg)} of ${kg1(d.roomKg)} a week (${Math.round((d.utilisation ?? 0) * 100)} %), ${d.householdCount} household${d.householdCount === 1 ? "" : "s"}`
                        : d.available
                          ? "No room this week"
                          : d.excluded
                            ? "Excluded from this proposal"
                            : `${d.status === "resting" ? "Resting" : "Offline"}: takes nobody`
                    }
                  />
                  {d.status === "active" ? (
                    <Checkbox
                      label={`Exclude ${d.name}`}
                      checked={excluded.includes(d.id)}
                      onChange={() => onToggleExcluded(d.id)}
                    />
                  ) : null}
                </li>
              ))}
            </ul>
          </CardContent>
        </Card>
      </div>
    </>
  );
}
