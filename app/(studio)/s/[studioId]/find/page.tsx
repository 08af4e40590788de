import type { Metadata } from "next";
import { FindClient } from "@/components/learning/find-client";

export const metadata: Metadata = { title: "Find by colour" };

export default function FindPage() {
  return <FindClient />;
}
