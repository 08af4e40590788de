import type { Metadata } from "next";
import { ProfilesClient } from "@/components/learning/profiles-client";

export const metadata: Metadata = { title: "Dye profiles" };

export default function ProfilesPage() {
  return <ProfilesClient />;
}
