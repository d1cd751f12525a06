import { useState } from "react";
import { Link, useSearchParams, type LoaderFunctionArgs } from "react-router-dom";
import { useQuery, type QueryClient } from "@tanstack/react-query";
import {
  Alert,
  Badge,
  Button,
  EmptyState,
  Field,
  Input,
  PageHeader,
  Table,
  TableCaption,
  TBody,
  TD,
  TH,
  THead,
  TR,
} from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { paths } from "@/config/paths";
import { meQueryOptions } from "@/features/auth/api/get-me";
import { requireUser } from "@/features/auth/utils/require-user";
import { usePlanRounds, useRounds } from "@/features/collections/api/rounds";

const km = (m: number) => (m >= 1000 ? `${(m / 1000).toFixed(2)} km` : `${Math.round(m)} m`);

function localToday(): string {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}-${String(d.getDate()).padStart(2, "0")}`;
}

function CollectionRoundsPage() {
  const { data: user } = useQuery(meQueryOptions());
  const coordinator = !!user?.roles.includes("coordinator");
  const [params, setParams] = useSearchParams();
  const date = params.get("date") ?? undefined;
  const [planDate, setPlanDate] = useState(date ?? localToday());
  const rounds = useRounds(date);
  const plan = usePlanRounds();

  return (
    <>
      <PageHeader
        title="Collection rounds"
        description={
          coordinator
            ? "Plan cargo-bike rounds for a day: volunteers collect the buckets of residents who asked and bring them to a digester with room."
            : "Your cargo-bike rounds: open one for its stops in order, print it, and mark each stop collected."
        }
      />
      {coordinator ? (
        <form
          className="mb-6 flex flex-wrap items-end gap-4"
          onSubmit={(e) => {
            e.preventDefault();
            plan.mutate(planDate, { onSuccess: () => setParams({ date: planDate }) });
          }}
        >
          <Field label="Day to plan">
            <Input type="date" value={planDate} onChange={(e) => setPlanDate(e.target.value)} required />
          </Field>
          <Button type="submit" loading={plan.isPending}>
            Plan rounds
          </Button>
        </form>
      ) : null}
      {plan.error ? (
        <Alert variant="danger" title="Could not plan">
          {plan.error.message}
        </Alert>
      ) : null}
      {plan.data ? (
        <Alert
          variant={plan.data.unplaced.length > 0 || plan.data.messages.length > 0 ? "warning" : "success"}
          title={`Planned ${plan.data.rounds.length} round${plan.data.rounds.length === 1 ? "" : "s"} for ${plan.data.forDate}, ${km(plan.data.totalM)} in all`}
        >
          <ul className="list-disc pl-5">
            {plan.data.messages.map((m, i) => (
              <li key={`m${i}`}>{m}</li>
            ))}
            {plan.data.unplaced.map((u) => (
              <li key={u.requestId}>{u.message}</li>
            ))}
          </ul>
        </Alert>
      ) : null}
      <section aria-labelledby="rounds-heading" className="mt-6 flex flex-col gap-3">
        <h2 id="rounds-heading" className="text-2xl font-bold">
          {date ? `Rounds on ${date}` : "Upcoming rounds"}
        </h2>
        {rounds.isPending ? (
          <p>Loading rounds…</p>
        ) : rounds.error ? (
          <Alert variant="danger" title="Could not load rounds">
            {rounds.error.message}
          </Alert>
        ) : rounds.data.rounds.length === 0 ? (
          <EmptyState
            title="No rounds"
            description={coordinator ? "Plan a day above." : "No round is planned for you yet."}
          />
        ) : (
          <Table label="Collection rounds">
            <TableCaption className="sr-only">
              Rounds with their volunteer, stops, load, length and end digester
            </TableCaption>
            <THead>
              <TR>
                <TH>Day</TH>
                <TH>Volunteer</TH>
                <TH>Stops</TH>
                <TH>Load</TH>
                <TH>Length</TH>
                <TH>Ends at</TH>
                <TH>Status</TH>
              </TR>
            </THead>
            <TBody>
              {rounds.data.rounds.map((r) => (
                <TR key={r.id}>
                  <TD>
                    <Link
                      to={paths.roundSheet(r.id)}
                      className="inline-flex min-h-11 items-center font-bold text-primary underline"
                    >
                      {r.forDate}
                      <span className="sr-only">: round sheet of {r.volunteerName}</span>
                    </Link>
                  </TD>
                  <TD>{r.volunteerName}</TD>
                  <TD>
                    {r.collectedCount} of {r.stopCount} collected
                  </TD>
                  <TD>{r.loadKg.toFixed(0)} kg</TD>
                  <TD>{km(r.totalM)}</TD>
                  <TD>{r.endDigesterName}</TD>
                  <TD>
                    <Badge tone={r.status === "done" ? "success" : "neutral"}>
                      {r.status === "done" ? "Done" : r.status === "planned" ? "Planned" : "Cancelled"}
                    </Badge>
                  </TD>
                </TR>
              ))}
            </TBody>
          </Table>
        )}
      </section>
    </>
  );
}

export function createRoute(queryClient: QueryClient) {
  return {
    loader: async ({ request }: LoaderFunctionArgs) => {
      await requireUser(queryClient, request);
      return null;
    },
    Component: CollectionRoundsPage,
    ErrorBoundary: RouteError,
  };
}
