import { OfflineStatus } from "@/components/offline/offline-status";
import { StudioNav } from "@/components/shell/studio-nav";
import { TopBar } from "@/components/shell/top-bar";
import { StudioProvider } from "@/components/studio/studio-context";
import { TimerBar } from "@/components/timers/timer-bar";
import { requireMembership } from "@/lib/pages/studio";

export default async function StudioLayout({
  children,
  params,
}: {
  children: React.ReactNode;
  params: Promise<{ studioId: string }>;
}) {
  const { studioId } = await params;
  const m = await requireMembership(studioId, `/s/${studioId}`);
  return (
    <StudioProvider value={{ studioId: m.studio.id, studioName: m.studio.name, role: m.role, userId: m.user.id }}>
      <TopBar studioName={m.studio.name} userName={m.user.name} />
      <OfflineStatus />
      <div className="mx-auto flex max-w-6xl md:gap-6 md:px-4 md:pt-4">
        <StudioNav studioId={m.studio.id} role={m.role} />
        <main className="min-w-0 flex-1 px-4 pt-4 pb-28 md:px-0 md:pb-10">{children}</main>
      </div>
      <TimerBar />
    </StudioProvider>
  );
}
