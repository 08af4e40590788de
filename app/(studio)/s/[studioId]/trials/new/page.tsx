import type { Metadata } from "next";
import { NewTrial } from "@/components/trial/new-trial";

export const metadata: Metadata = { title: "New trial" };

export default function NewTrialPage() {
  return <NewTrial />;
}
