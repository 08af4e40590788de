import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { SignInClient } from "@/components/auth/sign-in-client";
import { getSessionUser } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Sign in" };

const ERRORS: Record<string, string> = {
  CredentialsSignin: "That e-mail and password do not match. Check both, or ask for a sign-in link instead.",
  Verification: "That sign-in link has expired or was used already. Ask for a new one below.",
  EmailSignin: "We could not send the sign-in mail. Try again in a moment.",
};

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string; error?: string }> }) {
  const { next, error } = await searchParams;
  const safeNext = sameOriginPath(next);
  if (await getSessionUser()) redirect(safeNext);
  return <SignInClient next={safeNext} error={error ? (ERRORS[error] ?? "Sign-in did not work. Try again.") : undefined} />;
}

/** `next` when it stays on this site, else "/". Parsed as a URL: browsers read "/\\host" as "//host". */
function sameOriginPath(next: string | undefined): string {
  if (!next?.startsWith("/")) return "/";
  const base = "http://undertone.invalid";
  try {
    const u = new URL(next, base);
    return u.origin === base ? u.pathname + u.search + u.hash : "/";
  } catch {
    return "/";
  }
}
