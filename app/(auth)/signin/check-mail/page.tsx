import type { Metadata } from "next";
import Link from "next/link";
import { Sheet } from "@/components/ui/sheet";

export const metadata: Metadata = { title: "Check your mail" };

export default async function CheckMailPage({ searchParams }: { searchParams: Promise<{ email?: string }> }) {
  const { email } = await searchParams;
  return (
    <Sheet>
      <h1 className="text-2xl">Check your mail</h1>
      <p className="mt-2 text-ink-soft">
        We sent a sign-in link{email ? <> to <strong className="text-ink">{email}</strong></> : null}. Open it on this
        device; it works once, for 24 hours.
      </p>
      <p className="mt-4">
        <Link href="/signin" className="inline-flex min-h-11 items-center text-accent underline underline-offset-4">
          Use a different address
        </Link>
      </p>
    </Sheet>
  );
}
