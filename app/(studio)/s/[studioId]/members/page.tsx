import type { Metadata } from "next";
import { MembersClient } from "@/components/studio/members-client";

export const metadata: Metadata = { title: "People" };

export default function MembersPage() {
  return <MembersClient />;
}
