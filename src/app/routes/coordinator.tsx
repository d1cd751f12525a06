import type { LoaderFunctionArgs } from "react-router-dom";
import type { QueryClient } from "@tanstack/react-query";
import { PageHeader } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { requireUser } from "@/features/auth/utils/require-user";
import { AssignmentBoard } from "@/features/coordinator/components/assignment-board";
import { RebalancingPanel } from "@/features/coordinator/components/rebalancing-panel";

function CoordinatorPage() {
  return (
    <>
      <PageHeader
        title="Assignments"
        description="Which digester each household brings its scraps to: keep every digester within its safe feed rate for the week while everyone walks as little as possible."
      />
      <div className="flex flex-col gap-10">
        <AssignmentBoard />
        <section aria-labelledby="rebalancing-heading" className="flex flex-col gap-3">
          <h2 id="rebalancing-heading" className="text-2xl font-bold">
            Rebalancing today and tomorrow
          </h2>
          <p className="text-muted">
            Drop-offs waiting at a digester that is resting, offline, or has less room than what is waiting.
          </p>
          <RebalancingPanel />
        </section>
      </div>
    </>
  );
}

export function createRoute(queryClient: QueryClient) {
  return {
    loader: async ({ request }: LoaderFunctionArgs) => {
      await requireUser(queryClient, request, ["coordinator"]);
      return null;
    },
    Component: CoordinatorPage,
    ErrorBoundary: RouteError,
  };
}
