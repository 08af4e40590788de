"use client";

// "5 min ago", "yesterday", "3 Mar" – with the full date and time on hover and for screen readers.
const rtf = typeof Intl !== "undefined" ? new Intl.RelativeTimeFormat("en-GB", { numeric: "auto" }) : null;

export function timeAgo(iso: string, now = Date.now()): string {
  const s = Math.round((new Date(iso).getTime() - now) / 1000);
  const a = Math.abs(s);
  if (!rtf) return new Date(iso).toLocaleString();
  if (a < 45) return "just now";
  if (a < 3600) return rtf.format(Math.round(s / 60), "minute");
  if (a < 86_400) return rtf.format(Math.round(s / 3600), "hour");
  if (a < 7 * 86_400) return rtf.format(Math.round(s / 86_400), "day");
  return new Date(iso).toLocaleDateString("en-GB", { day: "numeric", month: "short", year: a > 300 * 86_400 ? "numeric" : undefined });
}

export function TimeAgo({ iso, className = "" }: { iso: string; className?: string }) {
  const full = new Date(iso).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short" });
  return (
    <time dateTime={iso} title={full} className={className} suppressHydrationWarning>
      {timeAgo(iso)}
    </time>
  );
}
