import type { LoaderFunctionArgs } from "react-router-dom";
import { useSuspenseQuery, type QueryClient } from "@tanstack/react-query";
import { EmptyState, PageHeader } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { requireUser } from "@/features/auth/utils/require-user";
import { stewardTodayQueryOptions } from "@/features/steward/api/get-steward-today";
import { StewardDayCard } from "@/features/steward/components/steward-day";
import { formatDay } from "@/features/steward/utils/format";

function StewardTodayPage() {
  const { data } = useSuspenseQuery(stewardTodayQueryOptions());
  return (
    <>
      <PageHeader
        title="Today at your digesters"
        description={`${formatDay(data.date)}. How much each digester may still take, what households brought, and what the readings say.`}
      />
      {data.digesters.length === 0 ? (
        <EmptyState
          title="No digesters to look after"
          description="A coordinator chooses the stewards of each digester. Ask them to add you."
        />
      ) : (
        <div className="flex flex-col gap-8">
          {data.digesters.map((day) => (
            <StewardDayCard key={day.id} day={day} today={data.date} />
          ))}
        </div>
      )}
    </>
  );
}

export function createRoute(queryClient: QueryClient) {
  return {
    loader: async ({ request }: LoaderFunctionArgs) => {
      await requireUser(queryClient, request, ["steward", "coordinator"]);
      await queryClient.ensureQueryData(stewardTodayQueryOptions());
      return null;
    },
    Component: StewardTodayPage,
    ErrorBoundary: RouteError,
  };
}
