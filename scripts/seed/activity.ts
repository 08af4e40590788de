// A few moments of the demo studio's history for its feed, recorded with recordActivity as the app
// records them and dated back: the dyer and the guest designer joining, and the violet rub added to
// the rosehip trial two days after its first bath. Runs with the rest of the feed's history
// (scripts/seed/comments.ts), only while the feed is empty.
import type { EntityManager } from "@mikro-orm/postgresql";
import { MembershipSchema, type Role, type Studio } from "../../entities/studio";
import { LayerSchema, type Trial } from "../../entities/trial";
import type { User } from "../../entities/user";
import { layerWords, quoted, recordActivity, roleWords } from "../../lib/activity";
import { demoTrials } from "./trial-data";

const DAY = 86_400_000;

export async function seedHistory(em: EntityManager, studio: Studio, users: Record<Role, User>, trials: Trial[]): Promise<void> {
  const ago = (days: number) => new Date(Date.now() - days * DAY);
  // Old events: nobody is told about them now.
  const record = async (when: Date, input: Omit<Parameters<typeof recordActivity>[1], "studio" | "notifyFollowers">) => {
    const event = await recordActivity(em, { ...input, studio, notifyFollowers: false });
    event.createdAt = when;
  };

  const joined: [Role, number][] = [["dyer", 27], ["guest", 21]];
  for (const [role, days] of joined) {
    const m = await em.findOne(MembershipSchema, { studio, user: users[role] });
    await record(ago(days), {
      actor: users[role],
      kind: "member.joined",
      summary: `joined the studio as ${roleWords(role)}, invited by ${users.owner.name}`,
      subjectId: m?.id ?? null,
    });
  }

  const rosehip = demoTrials.find((t) => t.key === "rosehip-base");
  const trial = rosehip && trials.find((t) => t.title === rosehip.title);
  if (rosehip && trial) {
    const layers = await em.find(LayerSchema, { trial }, { orderBy: { position: "asc" } });
    for (const layer of layers.slice(1)) {
      await record(ago(rosehip.daysAgo - 2), {
        actor: users[rosehip.author],
        kind: "layer.added",
        summary: `added ${layerWords(layer.position, layer.method)} to ${quoted(trial.title)}`,
        trialId: trial.id,
        layerId: layer.id,
      });
    }
  }
}
