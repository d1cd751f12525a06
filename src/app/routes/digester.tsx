import type { ReactNode } from "react";
import { Link, useParams, type LoaderFunctionArgs } from "react-router-dom";
import { useQueryClient, useSuspenseQuery, type QueryClient } from "@tanstack/react-query";
import { Alert, Badge, buttonClasses, PageHeader, Spinner } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { paths } from "@/config/paths";
import { meQueryOptions } from "@/features/auth/api/get-me";
import { requireUser } from "@/features/auth/utils/require-user";
import { digesterDetailQueryOptions } from "@/features/digester/api/get-digester-detail";
import { digesterHistoryQueryOptions } from "@/features/digester/api/get-digester-history";
import { useFeedings, feedingsQueryOptions } from "@/features/digester/api/get-feedings";
import { useReadings, readingsQueryOptions } from "@/features/digester/api/get-readings";
import { digesterPageKeys } from "@/features/digester/api/keys";
import { FeedingsTable } from "@/features/digester/components/feedings-table";
import { GasFigures } from "@/features/digester/components/gas-figures";
import { HistoryCharts } from "@/features/digester/components/history-charts";
import { ProfileForm } from "@/features/digester/components/profile-form";
import { ReadingsTable } from "@/features/digester/components/readings-table";
import { StatusForm } from "@/features/digester/components/status-form";
import { stewardKeys } from "@/features/steward/api/keys";
import { SensorUpload } from "@/features/steward/components/sensor-upload";
import { StewardDayPanel } from "@/features/steward/components/steward-day";
import { DIGESTER_STATUS_WORDS } from "@/features/steward/utils/status";

const sections = [
  { id: "today", label: "Today" },
  { id: "history", label: "Last 60 days" },
  { id: "gas", label: "Gas and safety" },
  { id: "records", label: "Readings and feedings" },
  { id: "upload", label: "Upload a sensor log" },
  { id: "settings", label: "Settings and status" },
];

function parseId(raw: string | undefined): number {
  const id = Number(raw);
  if (!Number.isInteger(id) || id <= 0)
    throw new Response(null, { status: 404, statusText: "There is no such digester." });
  return id;
}

function Section({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <section id={id} aria-labelledby={`${id}-heading`} className="flex scroll-mt-4 flex-col gap-4">
      <h2 id={`${id}-heading`} className="text-2xl font-bold">
        {title}
      </h2>
      {children}
    </section>
  );
}

function LoadFailed({ what, error }: { what: string; error: Error }) {
  return (
    <Alert variant="danger" title={`The ${what} could not be shown`} announce="off">
      <p>{error.message}</p>
    </Alert>
  );
}

function Records({ id }: { id: number }) {
  const readings = useReadings(id);
  const feedings = useFeedings(id);
  return (
    <>
      <h3 className="text-xl font-bold">Readings</h3>
      {readings.data ? (
        <ReadingsTable digesterId={id} readings={readings.data} />
      ) : readings.error ? (
        <LoadFailed what="readings" error={readings.error} />
      ) : (
        <Spinner label="Loading the readings" />
      )}
      <h3 className="text-xl font-bold">Feedings</h3>
      {feedings.data ? (
        <FeedingsTable digesterId={id} feedings={feedings.data} />
      ) : feedings.error ? (
        <LoadFailed what="feedings" error={feedings.error} />
      ) : (
        <Spinner label="Loading the feedings" />
      )}
    </>
  );
}

function DigesterPage() {
  const id = parseId(useParams().id);
  const queryClient = useQueryClient();
  const { data: detail } = useSuspenseQuery(digesterDetailQueryOptions(id));
  const { data: history } = useSuspenseQuery(digesterHistoryQueryOptions(id));
  const { data: me } = useSuspenseQuery(meQueryOptions());
  const { profile, day } = detail;
  const status = DIGESTER_STATUS_WORDS[profile.status];
  const refreshPage = () => void queryClient.invalidateQueries({ queryKey: digesterPageKeys.one(id) });
  const refreshToday = () => void queryClient.invalidateQueries({ queryKey: stewardKeys.all });
  const canUpload = !!me && me.roles.includes("steward") && (me.stewardOf ?? []).includes(id);

  return (
    <>
      <PageHeader
        title={profile.name}
        description={profile.siteDescription || undefined}
        actions={
          <Link to={paths.stewardToday()} className={buttonClasses("outline", "sm")}>
            All your digesters today
          </Link>
        }
      >
        <p className="flex flex-wrap items-center gap-2">
          <Badge tone={status.tone}>{status.label}</Badge>
          <span>
            {profile.workingVolumeM3} m³ working volume · looked after by{" "}
            {profile.stewards.map((s) => s.name).join(", ") || "nobody yet"}
          </span>
        </p>
        {profile.status !== "active" && profile.statusReason ? <p>Reason: {profile.statusReason}</p> : null}
      </PageHeader>
      <nav aria-label="On this page" className="mb-8">
        <ul className="flex flex-wrap gap-x-4 gap-y-1">
          {sections.map((s) => (
            <li key={s.id}>
              <a href={`#${s.id}`} className="inline-flex min-h-11 items-center font-bold underline">
                {s.label}
              </a>
            </li>
          ))}
        </ul>
      </nav>
      <div className="flex flex-col gap-12">
        <Section id="today" title="Today">
          <StewardDayPanel day={day} today={history.to} onChanged={refreshPage} />
        </Section>
        <Section id="history" title="Last 60 days">
          <HistoryCharts history={history} />
        </Section>
        <Section id="gas" title="Gas and safety">
          <GasFigures profile={profile} history={history} />
        </Section>
        <Section id="records" title="Readings and feedings">
          <Records id={id} />
        </Section>
        <Section id="upload" title="Upload a sensor log">
          {canUpload ? (
            <SensorUpload digesterId={id} digesterName={profile.name} onChanged={refreshPage} />
          ) : (
            <p>Only this digester's stewards upload sensor logs.</p>
          )}
        </Section>
        <Section id="settings" title="Settings and status">
          <h3 className="text-xl font-bold">Status</h3>
          <StatusForm profile={profile} onChanged={refreshToday} />
          <h3 className="text-xl font-bold">Settings</h3>
          <ProfileForm profile={profile} onChanged={refreshToday} />
        </Section>
      </div>
    </>
  );
}

export function createRoute(queryClient: QueryClient) {
  return {
    loader: async ({ request, params }: LoaderFunctionArgs) => {
      await requireUser(queryClient, request, ["steward", "coordinator"]);
      const id = parseId(params.id);
      await Promise.all([
        queryClient.ensureQueryData(digesterDetailQueryOptions(id)),
        queryClient.ensureQueryData(digesterHistoryQueryOptions(id)),
        queryClient.prefetchQuery(readingsQueryOptions(id)),
        queryClient.prefetchQuery(feedingsQueryOptions(id)),
      ]);
      return null;
    },
    Component: DigesterPage,
    ErrorBoundary: RouteError,
  };
}
