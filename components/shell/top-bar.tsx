import Link from "next/link";
import { NotificationBell } from "@/components/activity/notification-bell";
import { Wordmark } from "./wordmark";

export function TopBar({ studioName, userName }: { studioName?: string; userName: string }) {
  return (
    <header className="no-print border-b border-rule bg-paper">
      <div className="mx-auto flex max-w-6xl items-center justify-between gap-1 px-4 py-2 sm:gap-3">
        <div className="flex min-w-0 items-center sm:gap-3">
          <Wordmark className="shrink-0 [&>span]:hidden sm:[&>span]:inline" />
          {studioName && (
            <Link
              href="/studios"
              className="flex min-h-11 min-w-0 items-center gap-1 rounded-md px-1.5 text-base font-medium hover:bg-sheet sm:px-2"
              title="Switch studio"
            >
              <span className="truncate">{studioName}</span>
              <span aria-hidden="true" className="text-ink-faint">
                ⇅
              </span>
            </Link>
          )}
        </div>
        <div className="flex items-center gap-1">
          <NotificationBell />
          <Link
            href="/account"
            className="flex min-h-11 min-w-11 items-center justify-center rounded-md text-sm text-ink-soft hover:bg-sheet"
            aria-label={`Account of ${userName}`}
          >
            <span className="flex h-8 w-8 items-center justify-center rounded-full border border-rule-strong bg-sheet font-medium text-ink">
              {userName.slice(0, 1).toUpperCase()}
            </span>
          </Link>
        </div>
      </div>
    </header>
  );
}
