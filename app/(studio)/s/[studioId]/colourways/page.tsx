import type { Metadata } from "next";
import { ColourwaysClient } from "@/components/learning/colourways-client";

export const metadata: Metadata = { title: "Colourways" };

// The studio layout has already checked membership; the list loads on the client.
export default function ColourwaysPage() {
  return <ColourwaysClient />;
}
