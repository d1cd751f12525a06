import { useSuspenseQuery, type QueryClient } from "@tanstack/react-query";
import { PageHeader } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { publicDigestersQueryOptions } from "@/features/digesters/api/get-public-digesters";
import { PublicDigesterMap } from "@/features/digesters/components/public-digester-map";

function MapPage() {
  const { data } = useSuspenseQuery(publicDigestersQueryOptions());
  return (
    <>
      <PageHeader
        title="Digester map"
        description="Where the neighbourhood's digesters are and whether each is taking scraps. The list beside the map shows the same."
      />
      <PublicDigesterMap digesters={data} />
    </>
  );
}

export function createRoute(queryClient: QueryClient) {
  return {
    loader: async () => {
      await queryClient.ensureQueryData(publicDigestersQueryOptions());
      return null;
    },
    Component: MapPage,
    ErrorBoundary: RouteError,
  };
}
