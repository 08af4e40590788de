"use client";

import { ActivityFeed } from "./activity-feed";
import { NotificationList } from "./notification-list";

/** The activity page: what is for you first, then everything in the studio. */
export function ActivityClient() {
  return (
    <div className="mx-auto max-w-2xl space-y-8">
      <h1 className="text-3xl">Activity</h1>
      <NotificationList />
      <ActivityFeed />
    </div>
  );
}
