"use client";

import { SessionProvider } from "next-auth/react";
import { useState } from "react";
import { OfflineQueryProvider } from "@/components/offline/offline-provider";
import { registerOtherTrialWrites } from "@/components/offline/other-writes";
import { registerTrialWrites } from "@/components/offline/trial-writes";
import { makeQueryClient } from "@/components/query-client";
import { z } from "zod";

// Zod compiles object schemas with Function() when it may, and finds out by trying: under our
// Content-Security-Policy (no eval) every page load would report a violation. Parse without.
z.config({ jitless: true });

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
