import { createBrowserRouter, RouterProvider } from "react-router-dom";
import { AppShell } from "@/components/layout/app-shell";
import { RouteError } from "@/components/errors/route-error";
import { paths } from "@/config/paths";
import { queryClient } from "./query";

export function createRouter() {
  return createBrowserRouter([
    {
      element: <AppShell />,
      errorElement: <RouteError />,
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
