import type { Metadata } from "next";
import { LayerWizard } from "@/components/trial/wizard/layer-wizard";

export const metadata: Metadata = { title: "Change a layer" };

export default async function EditLayerPage({ params }: { params: Promise<{ trialId: string; layerId: string }> }) {
  const { trialId, layerId } = await params;
  return <LayerWizard trialId={trialId} layerId={layerId} />;
}
