import { createQueryClient } from "@/lib/query-client";

/** The client's one QueryClient, shared by the provider and the route loaders. */
export const queryClient = createQueryClient();
