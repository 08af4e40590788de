import type { Metadata } from "next";
import { LayerWizard } from "@/components/trial/wizard/layer-wizard";

export const metadata: Metadata = { title: "New layer" };

export default async function NewLayerPage({
  params,
  searchParams,
}: {
  params: Promise<{ trialId: string }>;
  searchParams: Promise<{ method?: string }>;
}) {
  const [{ trialId }, { method }] = await Promise.all([params, searchParams]);
  return <LayerWizard trialId={trialId} initialMethod={method} />;
}
