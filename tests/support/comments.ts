// Helpers for the comment, notification and activity tests: a trial written straight through the
// ORM, small editor documents, and route parameters.
import { LayerSchema, TrialSchema } from "@/entities/trial";
import { getEm } from "@/lib/db";
import type { Person } from "./fixtures";

export async function makeTrial(studioId: string, author: Person, title: string, layers = 0): Promise<{ id: string; layerIds: string[] }> {
  const em = await getEm();
  const trial = em.create(TrialSchema, { studio: studioId, author: author.id, title, fibreWeightG: 100 });
  const ls = Array.from({ length: layers }, (_, i) => em.create(LayerSchema, { trial, position: i, method: "immersion" }));
  await em.flush();
  return { id: trial.id, layerIds: ls.map((l) => l.id) };
}

type Inline = Record<string, unknown>;

export const text = (t: string, marks?: Inline[]): Inline => ({ type: "text", text: t, ...(marks ? { marks } : {}) });
export const mention = (p: { id: string; name?: string }, label?: string): Inline => ({
  type: "mention",
  attrs: { id: p.id, label: label ?? p.name ?? "someone", mentionSuggestionChar: "@" },
});
export const link = (href: string): Inline => ({ type: "link", attrs: { href, target: "_blank", rel: "noopener" } });

/** A document of one paragraph. */
export function doc(...inline: Inline[]): Record<string, unknown> {
  return { type: "doc", content: [{ type: "paragraph", content: inline }] };
}
