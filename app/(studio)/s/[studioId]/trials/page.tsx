import type { Metadata } from "next";
import { Suspense } from "react";
import { TrialListClient, TrialListSkeleton } from "@/components/trials/trial-list-client";

export const metadata: Metadata = { title: "Trials" };

// The list reads its search and filters from the URL, which needs a Suspense boundary.
export default function TrialsPage() {
  return (
    <Suspense fallback={<TrialListSkeleton />}>
      <TrialListClient />
    </Suspense>
  );
}
