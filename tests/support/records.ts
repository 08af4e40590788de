// Records the route tests need as fixtures, written straight through the ORM: reference cards,
// colourways, comments and step timers (trials, layers and the library are in trial-fixtures.ts).
import { ColourwaySchema, CommentSchema, ReferenceCardSchema, StepTimerSchema } from "@/entities";
import { getEm } from "@/lib/db";
import { doc, text } from "./comments";
import type { Person } from "./fixtures";

/** A 1 × 2 card of two greys. */
export async function makeCard(studioId: string): Promise<string> {
  const em = await getEm();
  const c = em.create(ReferenceCardSchema, {
    studio: studioId,
    name: "Grey step card",
    rows: 1,
    cols: 2,
    patches: [
      { name: "light", L: 80, a: 0, b: 0 },
      { name: "dark", L: 30, a: 0, b: 0 },
    ],
  });
  await em.flush();
  return c.id;
}

export async function makeColourway(studioId: string, trialId: string, readingId: string, userId: string): Promise<string> {
  const em = await getEm();
  const c = em.create(ColourwaySchema, {
    studio: studioId,
    name: "Estuary grey",
    targetL: 50,
    targetA: 0,
    targetB: -5,
    sourceTrial: trialId,
    sourceReading: readingId,
    recipe: { fibreWeightG: 100, layers: [] },
    proposedBy: userId,
  });
  await em.flush();
  return c.id;
}

export async function makeComment(studioId: string, trialId: string, author: Person): Promise<{ id: string; version: number }> {
  const em = await getEm();
  const c = em.create(CommentSchema, {
    studio: studioId,
    trial: trialId,
    author: author.id,
    body: doc(text("Rinse ran clear after two changes.")) as never,
    bodyText: "Rinse ran clear after two changes.",
  });
  await em.flush();
  return { id: c.id, version: c.version };
}

/** A running twenty-minute timer. */
export async function makeTimer(studioId: string, trialId: string, userId: string): Promise<{ id: string; version: number }> {
  const em = await getEm();
  const t = em.create(StepTimerSchema, {
    studio: studioId,
    trial: trialId,
    startedBy: userId,
    label: "Steam",
    durationSec: 1200,
    runningSince: new Date(),
    state: "running",
  });
  await em.flush();
  return { id: t.id, version: t.version };
}
