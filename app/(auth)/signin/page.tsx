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
  const safeNext = next?.startsWith("/") && !next.startsWith("//") ? next : "/";
  if (await getSessionUser()) redirect(safeNext);
  return <SignInClient next={safeNext} error={error ? (ERRORS[error] ?? "Sign-in did not work. Try again.") : undefined} />;
}
