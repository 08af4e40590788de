import type { Metadata } from "next";
import { StudioHome } from "@/components/studio/studio-home";
import { requireMembership } from "@/lib/pages/studio";

export const metadata: Metadata = { title: "Studio" };

export default async function StudioPage({ params }: { params: Promise<{ studioId: string }> }) {
  const { studioId } = await params;
  const m = await requireMembership(studioId);
  return <StudioHome firstName={m.user.name.split(" ")[0]} />;
}
