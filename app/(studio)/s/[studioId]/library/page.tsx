import type { Metadata } from "next";
import { Suspense } from "react";
import { LibraryClient } from "@/components/library/library-client";

export const metadata: Metadata = { title: "Library" };

// The studio layout has already checked membership; the lists load on the client.
export default function LibraryPage() {
  return (
    <Suspense>
      <LibraryClient />
    </Suspense>
  );
}
