import type { LoaderFunctionArgs } from "react-router-dom";
import { useSuspenseQuery, type QueryClient } from "@tanstack/react-query";
import { PageHeader } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { meQueryOptions } from "@/features/auth/api/get-me";
import { requireUser } from "@/features/auth/utils/require-user";
import { digesterNamesQueryOptions } from "@/features/people/api/get-digester-names";
import { peopleQueryOptions } from "@/features/people/api/get-people";
import { undeliveredEmailsQueryOptions } from "@/features/people/api/get-undelivered-emails";
import { PeopleManager } from "@/features/people/components/people-manager";

function PeoplePage() {
  const { data: user } = useSuspenseQuery(meQueryOptions());
  return (
    <>
      <PageHeader
        title="People"
        description="Everyone in the group: invite people, give roles, choose stewards for each digester, or disable an account."
      />
      <PeopleManager currentUserId={user?.id ?? 0} />
    </>
  );
}

export function createRoute(queryClient: QueryClient) {
  return {
    loader: async ({ request }: LoaderFunctionArgs) => {
      await requireUser(queryClient, request, ["coordinator"]);
      await Promise.all([
        queryClient.ensureQueryData(peopleQueryOptions()),
        queryClient.ensureQueryData(digesterNamesQueryOptions()),
        queryClient.ensureQueryData(undeliveredEmailsQueryOptions()),
      ]);
      return null;
    },
    Component: PeoplePage,
    ErrorBoundary: RouteError,
  };
}
