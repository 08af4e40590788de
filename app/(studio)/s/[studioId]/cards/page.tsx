import type { Metadata } from "next";
import { CardsClient } from "@/components/photos/cards-client";

export const metadata: Metadata = { title: "Reference cards" };

export default function CardsPage() {
  return <CardsClient />;
}
