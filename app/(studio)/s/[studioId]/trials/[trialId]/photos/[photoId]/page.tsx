import type { Metadata } from "next";
import { MeasureClient } from "@/components/photos/measure-client";

export const metadata: Metadata = { title: "Measure a photo" };

export default async function MeasurePage({ params }: { params: Promise<{ trialId: string; photoId: string }> }) {
  const { trialId, photoId } = await params;
  return <MeasureClient trialId={trialId} photoId={photoId} />;
}
