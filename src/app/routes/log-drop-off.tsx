import { useState } from "react";
import { redirect, useSearchParams, type LoaderFunctionArgs } from "react-router-dom";
import { useSuspenseQuery, type QueryClient } from "@tanstack/react-query";
import type { CreatedDropOff } from "@shared/schemas/drop-offs";
import { PageHeader } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { paths } from "@/config/paths";
import { requireUser } from "@/features/auth/utils/require-user";
import { digestersTodayQueryOptions } from "@/features/drop-offs/api/get-digesters-today";
import { DropOffResult } from "@/features/drop-offs/components/drop-off-result";
import { LogDropOffForm } from "@/features/drop-offs/components/log-drop-off-form";
import { myHouseholdQueryOptions } from "@/features/households/api/get-my-household";

function LogDropOffPage() {
  const { data: digesters } = useSuspenseQuery(digestersTodayQueryOptions());
  const { data: mine } = useSuspenseQuery(myHouseholdQueryOptions());
  const [params] = useSearchParams();
  const [created, setCreated] = useState<CreatedDropOff | null>(null);
  // A new form (fresh state and idempotency key) for each drop-off.
  const [round, setRound] = useState(0);
  const household = mine.household;
  const asked = Number(params.get("digester"));
  const initial = digesters.some((d) => d.id === asked) ? asked : (household?.digester?.id ?? null);

  return (
    <div className="mx-auto max-w-xl">
      <PageHeader title="Log a drop-off" description="Tell your steward what you are bringing. It takes a few taps." />
      {created ? (
        <DropOffResult
          created={created}
          onAnother={() => {
            setCreated(null);
            setRound((r) => r + 1);
          }}
        />
      ) : (
        <LogDropOffForm
          key={round}
          digesters={digesters}
          initialDigesterId={initial}
          householdDigesterId={household?.digester?.id ?? null}
          home={household?.location ?? null}
          onLogged={setCreated}
        />
      )}
    </div>
  );
}

export function createRoute(queryClient: QueryClient) {
  return {
    loader: async ({ request }: LoaderFunctionArgs) => {
      await requireUser(queryClient, request, ["resident"]);
      const [mine] = await Promise.all([
        queryClient.ensureQueryData(myHouseholdQueryOptions()),
        queryClient.ensureQueryData(digestersTodayQueryOptions()),
      ]);
      // A resident without a household registers it first.
      if (!mine.household) throw redirect(`${paths.household()}?first=drop-off`);
      return null;
    },
    Component: LogDropOffPage,
    ErrorBoundary: RouteError,
  };
}
