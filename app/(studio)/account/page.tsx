import type { Metadata } from "next";
import { AccountClient } from "@/components/account/account-client";
import { TopBar } from "@/components/shell/top-bar";
import { requireUser } from "@/lib/pages/studio";

export const metadata: Metadata = { title: "Account" };

export default async function AccountPage() {
  const user = await requireUser("/account");
  return (
    <>
      <TopBar userName={user.name} />
      <main className="mx-auto max-w-xl px-4 py-6">
        <AccountClient />
      </main>
    </>
  );
}
