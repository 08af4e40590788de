"use client";

import { SessionProvider } from "next-auth/react";
import { useState } from "react";
import { OfflineQueryProvider } from "@/components/offline/offline-provider";
import { registerOtherTrialWrites } from "@/components/offline/other-writes";
import { registerTrialWrites } from "@/components/offline/trial-writes";
import { makeQueryClient } from "@/components/query-client";

export function Providers({ children }: { children: React.ReactNode }) {
  const [client] = useState(() => {
    const c = makeQueryClient();
    // Before the kept cache is restored, so restored changes find their functions.
    registerTrialWrites(c);
    registerOtherTrialWrites(c);
    return c;
  });
  return (
    <SessionProvider>
      <OfflineQueryProvider client={client}>{children}</OfflineQueryProvider>
    </SessionProvider>
  );
}
