import { createBrowserRouter, RouterProvider } from "react-router-dom";
import { RouteError } from "@/components/errors/route-error";
import { Spinner } from "@/components/ui";
import { paths } from "@/config/paths";
import { meQueryOptions } from "@/features/auth/api/get-me";
import { queryClient } from "./query";
import { RootLayout } from "./root-layout";

export function createRouter() {
  return createBrowserRouter([
    {
      element: <RootLayout />,
      errorElement: <RouteError standalone />,
      // Who is signed in decides the navigation; a failed check just shows the visitor's view.
      loader: async () => {
        await queryClient.ensureQueryData(meQueryOptions()).catch(() => null);
        return null;
      },
      hydrateFallbackElement: <Spinner label="Loading Hearthloop" />,
      children: [
        {
          path: paths.home(),
          lazy: async () => (await import("./routes/landing")).route,
        },
        {
          path: paths.map(),
          // The map and Leaflet load in their own chunk.
          lazy: async () => (await import("./routes/map")).createRoute(queryClient),
        },
        {
          path: paths.plan(),
          // The calculators and recharts load in their own chunk.
          lazy: async () => (await import("./routes/plan")).route,
        },
        {
          path: paths.signIn(),
          lazy: async () => (await import("./routes/sign-in")).createRoute(queryClient),
        },
        {
          path: paths.resetPassword(),
          lazy: async () => (await import("./routes/reset-password")).route,
        },
        {
          path: paths.resetPasswordWithToken(":token"),
          lazy: async () => (await import("./routes/reset-password-token")).route,
        },
        {
          path: paths.invitation(":token"),
          lazy: async () => (await import("./routes/invitation")).route,
        },
        {
          path: paths.account(),
          lazy: async () => (await import("./routes/account")).createRoute(queryClient),
        },
        {
          path: paths.people(),
          lazy: async () => (await import("./routes/people")).createRoute(queryClient),
        },
        {
          path: paths.household(),
          lazy: async () => (await import("./routes/household")).createRoute(queryClient),
        },
        {
          path: paths.logDropOff(),
          lazy: async () => (await import("./routes/log-drop-off")).createRoute(queryClient),
        },
        {
          path: paths.dropOffs(),
          // The drop-off table and its stats load in their own chunk.
          lazy: async () => (await import("./routes/drop-off-history")).createRoute(queryClient),
        },
        {
          path: paths.stewardToday(),
          lazy: async () => (await import("./routes/steward-today")).createRoute(queryClient),
        },
        {
          path: paths.digester(":id"),
          // Charts (recharts) and the records tables load in this route's own chunk.
          lazy: async () => (await import("./routes/digester")).createRoute(queryClient),
        },
        {
          path: paths.coordinator(),
          // The assignment board, its map and table load in their own chunk.
          lazy: async () => (await import("./routes/coordinator")).createRoute(queryClient),
        },
        {
          path: paths.collectionRounds(),
          lazy: async () => (await import("./routes/collection-rounds")).createRoute(queryClient),
        },
        {
          path: paths.roundSheet(":id"),
          lazy: async () => (await import("./routes/round-sheet")).createRoute(queryClient),
        },
        {
          path: "*",
          lazy: async () => (await import("./routes/not-found")).route,
        },
      ],
    },
  ]);
}

const router = createRouter();

export function AppRouter() {
  return <RouterProvider router={router} />;
}
