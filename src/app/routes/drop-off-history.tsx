import { Link, redirect, type LoaderFunctionArgs } from "react-router-dom";
import { useSuspenseQuery, type QueryClient } from "@tanstack/react-query";
import { buttonClasses, PageHeader } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { paths } from "@/config/paths";
import { requireUser } from "@/features/auth/utils/require-user";
import { impactQueryOptions } from "@/features/drop-offs/api/get-impact";
import { myDropOffsQueryOptions } from "@/features/drop-offs/api/get-my-drop-offs";
import { DropOffHistoryTable } from "@/features/drop-offs/components/drop-off-history-table";
import { ImpactStats } from "@/features/drop-offs/components/impact-stats";
import { myHouseholdQueryOptions } from "@/features/households/api/get-my-household";

function DropOffHistoryPage() {
  const { data: dropOffs } = useSuspenseQuery(myDropOffsQueryOptions());
  const { data: impact } = useSuspenseQuery(impactQueryOptions());
  return (
    <>
      <PageHeader
        title="Your drop-offs"
        description="Everything your household brought, and what became of it."
        actions={
          <Link to={paths.logDropOff()} className={buttonClasses("primary")}>
            Log a drop-off
          </Link>
        }
      />
      <div className="flex flex-col gap-10">
        <ImpactStats impact={impact} />
        <section aria-labelledby="history-heading" className="flex flex-col gap-4">
          <h2 id="history-heading" className="text-2xl font-bold">
            Every drop-off
          </h2>
          <DropOffHistoryTable dropOffs={dropOffs} />
        </section>
      </div>
    </>
  );
}

export function createRoute(queryClient: QueryClient) {
  return {
    loader: async ({ request }: LoaderFunctionArgs) => {
      await requireUser(queryClient, request, ["resident"]);
      const [mine] = await Promise.all([
        queryClient.ensureQueryData(myHouseholdQueryOptions()),
        queryClient.ensureQueryData(myDropOffsQueryOptions()),
        queryClient.ensureQueryData(impactQueryOptions()),
      ]);
      if (!mine.household) throw redirect(`${paths.household()}?first=drop-off`);
      return null;
    },
    Component: DropOffHistoryPage,
    ErrorBoundary: RouteError,
  };
}
