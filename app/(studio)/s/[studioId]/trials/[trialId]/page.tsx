import type { Metadata } from "next";
import { CommentThread } from "@/components/comments/comment-thread";
import { TrialComparison } from "@/components/learning/trial-comparison";
import { TrialPhotosSection } from "@/components/photos/trial-photos-section";
import { TrialClient } from "@/components/trial/trial-client";

export const metadata: Metadata = { title: "Trial" };

export default async function TrialPage({ params }: { params: Promise<{ trialId: string }> }) {
  const { trialId } = await params;
  return (
    <>
      <TrialClient trialId={trialId} />
      <TrialPhotosSection trialId={trialId} />
      <TrialComparison trialId={trialId} />
      <CommentThread trialId={trialId} />
    </>
  );
}
