import { useSuspenseQuery, type QueryClient } from "@tanstack/react-query";
import { PageHeader } from "@/components/ui";
import { RouteError } from "@/components/errors/route-error";
import { meQueryOptions } from "@/features/auth/api/get-me";
import { publicDigestersQueryOptions } from "@/features/digesters/api/get-public-digesters";
import { PublicDigesterMap } from "@/features/digesters/components/public-digester-map";
import { digestersTodayQueryOptions } from "@/features/drop-offs/api/get-digesters-today";
import { householdsQueryOptions } from "@/features/households/api/get-households";
import { NeighbourhoodMap } from "@/features/neighbourhood-map/components/neighbourhood-map";

function PublicMap() {
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

function SignedInMap({ canLogDropOff, coordinator }: { canLogDropOff: boolean; coordinator: boolean }) {
  const { data: digesters } = useSuspenseQuery(digestersTodayQueryOptions());
  const { data: households } = useSuspenseQuery(householdsQueryOptions());
  return (
    <>
      <PageHeader
        title="Digester map"
        description={`Each digester's room today, in symbols on the map and in words in the list${coordinator ? ", with every household" : ", with your home"}.`}
      />
      <NeighbourhoodMap digesters={digesters} households={households} canLogDropOff={canLogDropOff} />
    </>
  );
}

/** One URL for everyone: visitors see the public map, signed-in people today's room and their household. */
function MapPage() {
  const { data: me } = useSuspenseQuery(meQueryOptions());
  if (!me) return <PublicMap />;
  return (
    <SignedInMap
      canLogDropOff={me.roles.includes("resident") && me.householdId !== null}
      coordinator={me.roles.includes("coordinator")}
    />
  );
}

export function createRoute(queryClient: QueryClient) {
  return {
    loader: async () => {
      const me = await queryClient.ensureQueryData(meQueryOptions()).catch(() => null);
      if (me) {
        await Promise.all([
          queryClient.ensureQueryData(digestersTodayQueryOptions()),
          queryClient.ensureQueryData(householdsQueryOptions()),
        ]);
      } else {
        await queryClient.ensureQueryData(publicDigestersQueryOptions());
      }
      return null;
    },
    Component: MapPage,
    ErrorBoundary: RouteError,
  };
}
