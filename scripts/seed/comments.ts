// The demo studio's conversation: the activity history of the seeded trials, and an invented
// comment thread on the dyer's rubbed-violet trial (the owner asks for a change, the dyer answers
// with swatch chips, the guest designer weighs in, one note on a single layer), with the
// notifications and follows it would have made. Skipped when the studio has comments already.
import { randomUUID } from "node:crypto";
import type { EntityManager } from "@mikro-orm/postgresql";
import { ActivityEventSchema, CommentSchema, FollowSchema, NotificationSchema } from "../../entities/comment";
import type { Role, Studio } from "../../entities/studio";
import { LayerSchema, TrialSchema } from "../../entities/trial";
import type { User } from "../../entities/user";
import { type CommentDocument, type InlineNode as Inline, type Paragraph, docText, mentionIds } from "../../lib/schemas/comment";
import { seedHistory } from "./activity";

const THREAD_TRIAL = "Rosehip sock, violet rubbed over";
const HOUR = 3_600_000;

const t = (text: string, bold = false): Inline => ({ type: "text", text, ...(bold ? { marks: [{ type: "bold" as const }] } : {}) });
const at = (u: User): Inline => ({ type: "mention", attrs: { id: u.id, label: u.name } });
const chip = (hex: string): Inline => ({ type: "swatch", attrs: { hex } });
const para = (...content: Inline[]): Paragraph => ({ type: "paragraph", content });

interface Line {
  by: Role;
  hoursAgo: number;
  layer?: number;
  body: (u: Record<Role, User>) => CommentDocument;
}

const thread: Line[] = [
  {
    by: "owner",
    hoursAgo: 52,
    body: (u) => ({
      type: "doc",
      content: [
        para(t("The violet grabbed the nylon much harder than the wool – on a sock leg those dark flecks will stack up. "), at(u.dyer), t(" could you try the rub at half strength on the next skein?")),
      ],
    }),
  },
  {
    by: "dyer",
    hoursAgo: 49,
    body: () => ({
      type: "doc",
      content: [
        para(t("Will do. Where the rub was thickest it read about "), chip("#5b3a6e"), t(", at the edges nearer "), chip("#9a7bb0"), t(".")),
        {
          type: "bulletList",
          content: [
            { type: "listItem", content: [para(t("halve the violet", true), t(" in the paste"))] },
            { type: "listItem", content: [para(t("same citric, same 30 min steam"))] },
          ],
        },
      ],
    }),
  },
  {
    by: "guest",
    hoursAgo: 26,
    body: (u) => ({
      type: "doc",
      content: [
        para(t("From the knitting side: this would pool in plain stocking stitch, but it could be lovely in a slip-stitch heel. Is it still this dark after a wash? "), at(u.owner)),
      ],
    }),
  },
  {
    by: "dyer",
    hoursAgo: 20,
    layer: 1,
    body: () => ({ type: "doc", content: [para(t("On this layer the paste soaked through to the inside of the skein wherever I pressed hardest. Lighter hands next time."))] }),
  },
];

/** Activity for every seeded trial and a few other moments (when the feed is empty), then the demo thread. */
export async function seedComments(em: EntityManager, studio: Studio, users: Record<Role, User>): Promise<number> {
  if ((await em.count(CommentSchema, { studio })) > 0) return 0;
  const byId = new Map(Object.values(users).map((u) => [u.id, u]));

  const trials = await em.find(TrialSchema, { studio }, { orderBy: { createdAt: "asc" } });
  if ((await em.count(ActivityEventSchema, { studio })) === 0) {
    for (const tr of trials) {
      const copied = Boolean(tr.copiedFrom);
      em.create(ActivityEventSchema, {
        id: randomUUID(),
        createdAt: tr.createdAt,
        studio,
        actor: tr.author.id,
        kind: copied ? "trial.copied" : "trial.created",
        trialId: tr.id,
        subjectId: tr.copiedFrom?.id ?? null,
        summary: copied ? `started “${tr.title}” from the recipe of “${trials.find((x) => x.id === tr.copiedFrom?.id)?.title}”` : `started “${tr.title}”`,
      });
    }
    await seedHistory(em, studio, users, trials);
  }

  const trial = trials.find((x) => x.title === THREAD_TRIAL);
  if (!trial) return 0;
  const layers = await em.find(LayerSchema, { trial }, { orderBy: { position: "asc" } });
  for (const line of thread) {
    const when = new Date(Date.now() - line.hoursAgo * HOUR);
    const author = users[line.by];
    const body = line.body(users);
    const comment = em.create(CommentSchema, {
      id: randomUUID(),
      createdAt: when,
      updatedAt: when,
      studio,
      trial,
      layer: line.layer !== undefined ? (layers[line.layer] ?? null) : null,
      author,
      body,
      bodyText: docText(body),
      mentions: mentionIds(body),
    });
    const flat = comment.bodyText.replace(/\s+/g, " ");
    const short = flat.length > 120 ? `${flat.slice(0, 119).trimEnd()}…` : flat;
    em.create(ActivityEventSchema, {
      id: randomUUID(),
      createdAt: when,
      studio,
      actor: author,
      kind: "comment.added",
      trialId: trial.id,
      layerId: comment.layer?.id ?? null,
      commentId: comment.id,
      summary: `commented on “${trial.title}”: ${short}`,
    });
    for (const id of comment.mentions) {
      em.create(NotificationSchema, {
        createdAt: when,
        user: byId.get(id)!,
        studio,
        kind: "mention",
        actor: author,
        trial,
        comment,
        summary: `${author.name} mentioned you on “${trial.title}”`,
      });
    }
  }
  // Everyone who wrote follows the trial, as they would have after commenting.
  for (const role of new Set(thread.map((l) => l.by))) {
    em.create(FollowSchema, { studio, user: users[role], targetType: "trial", targetId: trial.id });
  }
  await em.flush();
  return thread.length;
}
