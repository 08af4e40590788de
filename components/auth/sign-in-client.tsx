"use client";

import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice, Sheet } from "@/components/ui/sheet";

export function SignInClient({ next, error }: { next: string; error?: string }) {
  const router = useRouter();
  const [mode, setMode] = useState<"password" | "link">("password");
  const [email, setEmail] = useState("");
  const [password, setPassword] = useState("");
  const [message, setMessage] = useState<string | undefined>(error);
  const [busy, setBusy] = useState(false);

  async function withPassword(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setMessage(undefined);
    const res = await signIn("password", { email, password, redirect: false, callbackUrl: next });
    setBusy(false);
    if (res?.ok && !res.error) {
      // A full navigation, so every server component sees the new session cookie.
      window.location.assign(next);
    } else if (res?.status === 429 && res.error) {
      // Rate-limited: the server's sentence says how long to wait.
      setMessage(res.error);
    } else {
      setMessage("That e-mail and password do not match. Check both, or ask for a sign-in link instead.");
    }
  }

  async function withLink(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setMessage(undefined);
    const res = await signIn("email", { email, redirect: false, callbackUrl: next });
    setBusy(false);
    if (res?.ok && !res.error) router.push(`/signin/check-mail?email=${encodeURIComponent(email)}`);
    else if (res?.status === 429 && res.error) setMessage(res.error);
    else setMessage("We could not send the sign-in mail. Check the address and try again.");
  }

  return (
    <Sheet>
      <h1 className="text-2xl">Sign in to your studio</h1>
      <p className="mt-1 text-ink-soft">Your trials, swatches and colourways, from the dye table.</p>
      <div role="tablist" aria-label="How to sign in" className="mt-5 grid grid-cols-2 rounded-md border border-rule p-1">
        {(["password", "link"] as const).map((m) => (
          <button
            key={m}
            role="tab"
            type="button"
            aria-selected={mode === m}
            onClick={() => setMode(m)}
            className={`min-h-11 rounded text-base ${mode === m ? "bg-accent text-accent-ink" : "text-ink-soft"}`}
          >
            {m === "password" ? "Password" : "E-mail me a link"}
          </button>
        ))}
      </div>
      {message && (
        <Notice tone="danger" className="mt-4">
          {message}
        </Notice>
      )}
      <form onSubmit={mode === "password" ? withPassword : withLink} className="mt-4 space-y-4">
        <Field
          label="E-mail"
          type="email"
          name="email"
          autoComplete="email"
          inputMode="email"
          required
          value={email}
          onChange={(e) => setEmail(e.target.value)}
        />
        {mode === "password" ? (
          <Field
            label="Password"
            type="password"
            name="password"
            autoComplete="current-password"
            required
            value={password}
            onChange={(e) => setPassword(e.target.value)}
          />
        ) : (
          <p className="text-sm text-ink-soft">We send a link that signs you in once. No password needed.</p>
        )}
        <Button type="submit" className="w-full" disabled={busy}>
          {busy ? "One moment…" : mode === "password" ? "Sign in" : "Send the link"}
        </Button>
      </form>
    </Sheet>
  );
}
