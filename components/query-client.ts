import { QueryClient } from "@tanstack/react-query";

/** The one query-client factory. */
export function makeQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      // gcTime is a day so what was read stays in the device's kept cache for offline use.
      queries: { staleTime: 30_000, retry: 1, refetchOnWindowFocus: true, gcTime: 24 * 3600 * 1000 },
    },
  });
}
