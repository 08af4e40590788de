import { Wordmark } from "@/components/shell/wordmark";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col px-4 py-8">
      <Wordmark className="mb-8 self-start" />
      {children}
    </main>
  );
}
