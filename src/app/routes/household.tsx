import { useState } from "react";
import { Link, useSearchParams, type LoaderFunctionArgs } from "react-router-dom";
import { useQueryClient, useSuspenseQuery, type QueryClient } from "@tanstack/react-query";
import { Alert, buttonClasses, Card, CardContent, CardHeader, CardTitle, PageHeader } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { paths } from "@/config/paths";
import { authKeys } from "@/features/auth/api/keys";
import { requireUser } from "@/features/auth/utils/require-user";
import { myHouseholdQueryOptions } from "@/features/households/api/get-my-household";
import { streetsQueryOptions } from "@/features/households/api/get-streets";
import { DigesterCard } from "@/features/households/components/digester-card";
import { HouseholdForm } from "@/features/households/components/household-form";
import { MembersCard } from "@/features/households/components/members-card";
import { AskForCollection } from "@/features/collections/components/ask-for-collection";

function HouseholdPage() {
  const { data } = useSuspenseQuery(myHouseholdQueryOptions());
  const { data: streets } = useSuspenseQuery(streetsQueryOptions());
  const queryClient = useQueryClient();
  const [justRegistered, setJustRegistered] = useState(false);
  // Sent here from the drop-off page before a household exists.
  const [params] = useSearchParams();
  const redirected = params.get("first") === "drop-off";
  const household = data.household;

  if (!household) {
    return (
      <>
        <PageHeader
          title="Register your household"
          description="Before your first drop-off, tell us who you are and where your home is, so we can point you to the nearest digester with room."
        />
        {redirected ? (
          <Alert variant="info" title="One step first" className="mb-6">
            <p>Drop-offs are logged for a household. Register yours, then log your bucket.</p>
          </Alert>
        ) : null}
        <div className="max-w-2xl">
          <HouseholdForm
            streets={streets}
            onSaved={() => {
              setJustRegistered(true);
              // The session's household changed: navigation and other pages read it from /me.
              void queryClient.invalidateQueries({ queryKey: authKeys.me() });
            }}
          />
        </div>
      </>
    );
  }

  return (
    <>
      <PageHeader
        title="Your household"
        description={household.addressText ? `${household.name}, ${household.addressText}` : household.name}
      />
      <div className="flex flex-col gap-6">
        {justRegistered ? (
          <Alert variant="success" title="Your household is registered">
            <p>
              You can log your first drop-off now.{" "}
              <Link to={paths.logDropOff(household.digester?.id)} className="font-bold">
                Log a drop-off
              </Link>
            </p>
          </Alert>
        ) : null}
        <div className="grid gap-6 lg:grid-cols-2">
          <DigesterCard household={household} />
          <MembersCard household={household} />
        </div>
        <AskForCollection />
        <Card>
          <CardHeader>
            <CardTitle>Name, address and place</CardTitle>
          </CardHeader>
          <CardContent>
            <HouseholdForm streets={streets} household={household} />
          </CardContent>
        </Card>
        <p>
          <Link to={paths.dropOffs()} className={buttonClasses("outline")}>
            See your drop-offs and what they became
          </Link>
        </p>
      </div>
    </>
  );
}

export function createRoute(queryClient: QueryClient) {
  return {
    loader: async ({ request }: LoaderFunctionArgs) => {
      await requireUser(queryClient, request, ["resident"]);
      await Promise.all([
        queryClient.ensureQueryData(myHouseholdQueryOptions()),
        queryClient.ensureQueryData(streetsQueryOptions()),
      ]);
      return null;
    },
    Component: HouseholdPage,
    ErrorBoundary: RouteError,
  };
}
