import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import { requireUser } from "@/lib/pages/studio";
import { getEm } from "@/lib/db";
import { listMyStudios } from "@/lib/studios";

// The front door: the studio used last, else the first one, else the studio chooser.
export default async function Home() {
  const user = await requireUser();
  const studios = await listMyStudios(await getEm(), user.id);
  const last = (await cookies()).get("ut-studio")?.value;
  const target = studios.find((s) => s.id === last) ?? (studios.length === 1 ? studios[0] : undefined);
  redirect(target ? `/s/${target.id}` : "/studios");
}
