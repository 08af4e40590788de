"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { useUnreadCount } from "./use-activity";

const STUDIO_PATH = /^\/s\/([0-9a-f-]{36})(?:\/|$)/i;

/** A bell in the top bar with the unread count of the studio being looked at (hidden elsewhere). */
export function NotificationBell() {
  const studioId = usePathname().match(STUDIO_PATH)?.[1] ?? null;
  const count = useUnreadCount(studioId);
  if (!studioId) return null;
  const unread = count.data?.unread ?? 0;
  return (
    <Link
      href={`/s/${studioId}/activity#notifications`}
      aria-label={unread > 0 ? `Notifications, ${unread} unread` : "Notifications"}
      className="relative flex h-11 w-11 items-center justify-center rounded-md text-ink-soft hover:bg-sheet hover:text-ink"
    >
      <svg width="22" height="22" viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinejoin="round" aria-hidden="true">
        <path d="M6 16V11a6 6 0 0 1 12 0v5l1.5 2h-15z" />
        <path d="M10 20.5a2 2 0 0 0 4 0" />
      </svg>
      {unread > 0 && (
        <span className="absolute top-1 right-1 min-w-5 rounded-full bg-accent px-1 text-center text-xs leading-5 font-medium text-accent-ink tabular">
          {unread > 99 ? "99+" : unread}
        </span>
      )}
    </Link>
  );
}
