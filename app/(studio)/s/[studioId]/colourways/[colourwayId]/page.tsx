import type { Metadata } from "next";
import { ColourwayClient } from "@/components/learning/colourway-client";

export const metadata: Metadata = { title: "Colourway" };

export default async function ColourwayPage({ params }: { params: Promise<{ colourwayId: string }> }) {
  const { colourwayId } = await params;
  return <ColourwayClient colourwayId={colourwayId} />;
}
