import { lazy, Suspense } from "react";
import { Link, useParams, type LoaderFunctionArgs } from "react-router-dom";
import type { QueryClient } from "@tanstack/react-query";
import { COLLECTION_REQUEST_STATUS_LABELS } from "@shared/schemas/collections";
import {
  Alert,
  Badge,
  Button,
  buttonClasses,
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
import { requireUser } from "@/features/auth/utils/require-user";
import { useMarkCollected, useRoundSheet } from "@/features/collections/api/rounds";

const RoundMap = lazy(async () => ({
  default: (await import("@/features/collections/components/round-map")).RoundMap,
}));

const km = (m: number) => (m >= 1000 ? `${(m / 1000).toFixed(2)} km` : `${Math.round(m)} m`);

function RoundSheetPage() {
  const id = Number(useParams().id);
  const sheet = useRoundSheet(id);
  const collected = useMarkCollected(id);
  if (sheet.isPending) return <p>Loading the round…</p>;
  if (sheet.error)
    return (
      <Alert variant="danger" title="Could not load the round">
        {sheet.error.message}
      </Alert>
    );
  const s = sheet.data;
  // Stops are marked collected on the round's day (the server refuses earlier); "en-CA" gives YYYY-MM-DD.
  const later = s.forDate > new Date().toLocaleDateString("en-CA");
  return (
    <>
      <PageHeader
        title={`Round on ${s.forDate}`}
        description={`${s.volunteerName}: ${s.stopCount} stops, ${s.loadKg.toFixed(0)} kg, ${km(s.totalM)}, ending at ${s.endDigester.name}.`}
      />
      <div data-print-hide className="mb-4 flex flex-wrap gap-3">
        <Button type="button" variant="outline" onClick={() => window.print()}>
          Print this sheet
        </Button>
        <a
          className={buttonClasses("outline")}
          href={`/api/collection-rounds/${s.id}/geojson`}
          download={`round-${s.id}.geojson`}
        >
          Download the route (GeoJSON)
        </a>
        <Link className={buttonClasses("ghost")} to={paths.collectionRounds(s.forDate)}>
          All rounds on {s.forDate}
        </Link>
      </div>
      {collected.error ? (
        <Alert variant="danger" title="Not marked">
          {collected.error.message}
        </Alert>
      ) : null}
      <div className="grid grid-cols-[minmax(0,1fr)] gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <section aria-labelledby="stops-heading">
          <h2 id="stops-heading" className="mb-2 text-2xl font-bold">
            Stops in order
          </h2>
          <Table label="Stops in order, with addresses">
            <TableCaption className="sr-only">
              Each stop with its address, buckets and walk from the previous point
            </TableCaption>
            <THead>
              <TR>
                <TH>No.</TH>
                <TH>Address</TH>
                {/* Status before the figures: on a phone the "Mark collected" button stays on the first screen. */}
                <TH>Status</TH>
                <TH>Buckets</TH>
                <TH>From the last point</TH>
              </TR>
            </THead>
            <TBody>
              {s.stops.map((stop) => (
                <TR key={stop.requestId}>
                  <TD>{stop.seq}</TD>
                  <TD>
                    <strong>{stop.addressText || "No street address"}</strong>
                    <br />
                    {stop.householdName}
                  </TD>
                  <TD>
                    {stop.status === "planned" && later ? (
                      <span>To collect on {s.forDate}</span>
                    ) : stop.status === "planned" ? (
                      <Button
                        type="button"
                        size="sm"
                        data-print-hide
                        loading={collected.isPending && collected.variables === stop.requestId}
                        onClick={() => collected.mutate(stop.requestId)}
                      >
                        Mark collected<span className="sr-only"> at stop {stop.seq}</span>
                      </Button>
                    ) : (
                      <Badge tone={stop.status === "collected" ? "success" : "neutral"}>
                        {COLLECTION_REQUEST_STATUS_LABELS[stop.status]}
                      </Badge>
                    )}
                  </TD>
                  <TD>{stop.bucketCount}</TD>
                  <TD>{km(stop.legM)}</TD>
                </TR>
              ))}
              <TR>
                <TD>End</TD>
                <TD>
                  <strong>{s.endDigester.name}</strong>
                  <br />
                  {s.endDigester.siteDescription}
                </TD>
                <TD>Hand the buckets to the steward</TD>
                <TD>{s.loadKg.toFixed(0)} kg in all</TD>
                <TD>{km(s.endLegM)}</TD>
              </TR>
            </TBody>
          </Table>
        </section>
        <Suspense fallback={<p>Loading the map…</p>}>
          <RoundMap sheet={s} />
        </Suspense>
      </div>
    </>
  );
}

export function createRoute(queryClient: QueryClient) {
  return {
    loader: async ({ request }: LoaderFunctionArgs) => {
      await requireUser(queryClient, request);
      return null;
    },
    Component: RoundSheetPage,
    ErrorBoundary: RouteError,
  };
}
