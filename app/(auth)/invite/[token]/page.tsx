import type { Metadata } from "next";
import { InviteClient } from "@/components/auth/invite-client";
import { Sheet } from "@/components/ui/sheet";
import { getSessionUser } from "@/lib/auth/session";
import { getEm } from "@/lib/db";
import { HttpError } from "@/lib/errors";
import { previewInvitation } from "@/lib/invitations";

export const metadata: Metadata = { title: "Invitation" };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  try {
    const preview = await previewInvitation(await getEm(), token);
    const user = await getSessionUser();
    return <InviteClient token={token} preview={preview} signedInAs={user?.email ?? null} />;
  } catch (e) {
    const message = e instanceof HttpError ? e.message : "This invitation could not be opened.";
    return (
      <Sheet>
        <h1 className="text-2xl">Invitation</h1>
        <p className="mt-2 text-ink-soft">{message}</p>
      </Sheet>
    );
  }
}
