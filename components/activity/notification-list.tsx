"use client";

import Link from "next/link";
import { TimeAgo } from "@/components/comments/time-ago";
import { useStudio } from "@/components/studio/studio-context";
import { Button } from "@/components/ui/button";
import { EmptyState, Notice, SectionTitle } from "@/components/ui/sheet";
import { hrefFor, useMarkRead, useNotifications } from "./use-activity";

/** The caller's notifications in this studio, unread ones marked, newest first. */
export function NotificationList() {
  const { studioId } = useStudio();
  const q = useNotifications(studioId);
  const markRead = useMarkRead(studioId);
  const items = q.data?.pages.flatMap((p) => p.items) ?? [];
  const unread = q.data?.pages[0]?.unread ?? 0;

  return (
    <section id="notifications" aria-labelledby="notifications-title" className="scroll-mt-20">
      <SectionTitle
        action={
          unread > 0 ? (
            <Button variant="quiet" onClick={() => markRead.mutate(undefined)} disabled={markRead.isPending}>
              Mark all read
            </Button>
          ) : undefined
        }
      >
        <span id="notifications-title">For you</span>
        {unread > 0 && <span className="ml-2 align-middle text-base font-normal text-accent tabular">{unread} new</span>}
      </SectionTitle>
      {q.isError && <Notice tone="danger">Could not load your notifications. {q.error.message}</Notice>}
      {q.isSuccess && items.length === 0 && (
        <EmptyState title="Nothing for you yet">When someone mentions you, or comments on a trial you wrote or follow, it shows here.</EmptyState>
      )}
      {items.length > 0 && (
        <ul className="divide-y divide-rule" aria-label="Notifications">
          {items.map((n) => {
            const href = hrefFor(studioId, n);
            const body = (
              <>
                <span className={`mt-2 h-2.5 w-2.5 shrink-0 rounded-full ${n.readAt ? "bg-transparent" : "bg-accent"}`} aria-hidden="true" />
                <span className="min-w-0 flex-1">
                  <span className={n.readAt ? "text-ink-soft" : "font-medium text-ink"}>{n.summary}</span>
                  <TimeAgo iso={n.createdAt} className="block text-sm text-ink-faint" />
                </span>
                {!n.readAt && <span className="sr-only">(unread)</span>}
              </>
            );
            return (
              <li key={n.id}>
                {href ? (
                  <Link
                    href={href}
                    onClick={() => !n.readAt && markRead.mutate([n.id])}
                    className="-mx-2 flex min-h-11 items-start gap-3 rounded-md px-2 py-2 hover:bg-sheet"
                  >
                    {body}
                  </Link>
                ) : (
                  <div className="flex items-start gap-3 py-2">{body}</div>
                )}
              </li>
            );
          })}
        </ul>
      )}
      {q.hasNextPage && (
        <Button variant="plain" className="mt-2 w-full" onClick={() => q.fetchNextPage()} disabled={q.isFetchingNextPage}>
          Older notifications
        </Button>
      )}
    </section>
  );
}
