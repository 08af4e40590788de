"use client";

import { signIn, signOut } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { api } from "@/components/api";
import { Button } from "@/components/ui/button";
import { Notice, Sheet } from "@/components/ui/sheet";

interface Preview {
  studioName: string;
  email: string;
  role: string;
  invitedBy: string;
}

const ROLE_WORDS: Record<string, string> = {
  owner: "an owner — everything, including members and approving colourways",
  dyer: "a dyer — logging trials, photos, predictions and comments",
  guest: "a guest — reading the trials you are shown and commenting",
};

export function InviteClient({ token, preview, signedInAs }: { token: string; preview: Preview; signedInAs: string | null }) {
  const router = useRouter();
  const [error, setError] = useState<string>();
  const [busy, setBusy] = useState(false);
  const here = `/invite/${token}`;
  const matches = signedInAs?.toLowerCase() === preview.email;

  async function accept() {
    setBusy(true);
    try {
      const { studioId } = await api<{ studioId: string }>(`/api/invitations/${token}`, { method: "POST" });
      router.push(`/s/${studioId}`);
      router.refresh();
    } catch (e) {
      setError((e as Error).message);
      setBusy(false);
    }
  }

  async function sendLink() {
    setBusy(true);
    const res = await signIn("email", { email: preview.email, redirect: false, callbackUrl: here });
    if (res?.ok && !res.error) router.push(`/signin/check-mail?email=${encodeURIComponent(preview.email)}`);
    else {
      setError(res?.status === 429 && res.error ? res.error : "We could not send the sign-in mail. Try again in a moment.");
      setBusy(false);
    }
  }

  return (
    <Sheet>
      <p className="text-sm uppercase tracking-wide text-ink-faint">Invitation</p>
      <h1 className="mt-1 text-2xl">Join {preview.studioName}</h1>
      <p className="mt-2 text-ink-soft">
        {preview.invitedBy} invited <strong className="text-ink">{preview.email}</strong> to join as{" "}
        {ROLE_WORDS[preview.role] ?? preview.role}.
      </p>
      {error && (
        <Notice tone="danger" className="mt-4">
          {error}
        </Notice>
      )}
      <div className="mt-5 space-y-3">
        {matches ? (
          <Button className="w-full" onClick={accept} disabled={busy}>
            Join {preview.studioName}
          </Button>
        ) : signedInAs ? (
          <>
            <Notice tone="caution">
              You are signed in as {signedInAs}. This invitation is for {preview.email}.
            </Notice>
            <Button variant="plain" className="w-full" onClick={() => signOut({ callbackUrl: here })}>
              Sign out and continue as {preview.email}
            </Button>
          </>
        ) : (
          <>
            <Button className="w-full" onClick={sendLink} disabled={busy}>
              E-mail me a sign-in link
            </Button>
            <p className="text-sm text-ink-soft">
              The link signs you in as {preview.email} and brings you back here to join.
            </p>
          </>
        )}
      </div>
    </Sheet>
  );
}
