import Link from "next/link";

/** Undertone's mark: three overlapping washes, the idea of layered colour, drawn in ink. */
export function Wordmark({ className = "" }: { className?: string }) {
  return (
    <Link href="/" className={`inline-flex min-h-11 min-w-11 items-center justify-center gap-2 text-ink ${className}`} aria-label="Undertone home">
      <svg width="26" height="26" viewBox="0 0 26 26" aria-hidden="true">
        <circle cx="10" cy="10" r="7.5" fill="none" stroke="currentColor" strokeWidth="1.4" />
        <circle cx="16" cy="10" r="7.5" fill="none" stroke="currentColor" strokeWidth="1.4" opacity="0.7" />
        <circle cx="13" cy="15.5" r="7.5" fill="none" stroke="currentColor" strokeWidth="1.4" opacity="0.45" />
      </svg>
      <span className="font-serif text-xl font-semibold tracking-tight">Undertone</span>
    </Link>
  );
}
