import type { Metadata } from "next";
import { StudiosClient } from "@/components/studio/studios-client";
import { TopBar } from "@/components/shell/top-bar";
import { requireUser } from "@/lib/pages/studio";

export const metadata: Metadata = { title: "Your studios" };

export default async function StudiosPage() {
  const user = await requireUser("/studios");
  return (
    <>
      <TopBar userName={user.name} />
      <main className="mx-auto max-w-xl px-4 py-6">
        <StudiosClient />
      </main>
    </>
  );
}
