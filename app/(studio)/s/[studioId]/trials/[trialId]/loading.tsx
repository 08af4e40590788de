import { TrialSkeleton } from "@/components/trial/trial-client";

export default function Loading() {
  return <TrialSkeleton />;
}
