"use client";

import { createSyncStoragePersister } from "@tanstack/query-sync-storage-persister";
import { type QueryClient, useIsRestoring } from "@tanstack/react-query";
import { PersistQueryClientProvider, removeOldestQuery } from "@tanstack/react-query-persist-client";
import { useSession } from "next-auth/react";
import { useEffect, useState } from "react";
import { forgetOfflineState } from "./trial-writes";
import { clearUnsent } from "./unsent";

// The query cache and the changes waiting to be sent are kept in this device's localStorage, so a
// dropped connection or a reload at the dye table loses nothing. Waiting changes resume once the
// cache is back and the connection returns.

const CACHE_KEY = "undertone.cache";
const OWNER_KEY = "undertone.cache.owner";
/** Raise when the shape of cached data changes, so old caches are dropped rather than misread. */
const CACHE_SHAPE = "1";
/** How long a kept cache (with its waiting changes) is trusted after its last save. */
export const CACHE_MAX_AGE_MS = 7 * 24 * 3600 * 1000;

export function OfflineQueryProvider({ client, children }: { client: QueryClient; children: React.ReactNode }) {
  const [persister] = useState(() =>
    createSyncStoragePersister({
      storage: typeof window === "undefined" ? undefined : window.localStorage,
      key: CACHE_KEY,
      // Save soon after each change: a reload right after an offline edit must still find it.
      throttleTime: 100,
      retry: removeOldestQuery,
    }),
  );
  return (
    <PersistQueryClientProvider
      client={client}
      persistOptions={{
        persister,
        maxAge: CACHE_MAX_AGE_MS,
        buster: CACHE_SHAPE,
        dehydrateOptions: {
          // Keep a change that is waiting (offline) or retrying after a failed send; a first try
          // still in flight is not kept, so a reload cannot send it twice.
          shouldDehydrateMutation: (m) => m.state.status === "pending" && (m.state.isPaused || m.state.failureCount > 0),
          shouldDehydrateQuery: (q) => q.state.status === "success",
        },
      }}
      // The kept cache shows at once; once the waiting changes are sent, a reload still asks the
      // server for what others changed meanwhile (offline, that waits for the connection).
      onSuccess={() => client.resumePausedMutations().then(() => client.invalidateQueries())}
    >
      <OwnerGuard client={client} />
      {children}
    </PersistQueryClientProvider>
  );
}

/** A kept cache belongs to one person: when someone else signs in on this device, it is dropped. */
function OwnerGuard({ client }: { client: QueryClient }) {
  const restoring = useIsRestoring();
  const { data, status } = useSession();
  const userId = data?.user && "id" in data.user ? (data.user.id as string) : null;
  useEffect(() => {
    // Offline, the session cannot be read: keep everything.
    if (restoring || status !== "authenticated" || !userId) return;
    let owner: string | null = null;
    try {
      owner = localStorage.getItem(OWNER_KEY);
    } catch {
      return;
    }
    if (owner === userId) return;
    if (owner !== null) {
      client.getMutationCache().clear();
      client.clear();
      forgetOfflineState();
      clearUnsent();
    }
    localStorage.setItem(OWNER_KEY, userId);
  }, [restoring, status, userId, client]);
  return null;
}
