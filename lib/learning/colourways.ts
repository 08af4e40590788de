import "server-only";
import { randomUUID } from "node:crypto";
import type { EntityManager } from "@mikro-orm/postgresql";
import { judgeLot, type Lab } from "@/colour";
import { ColourwaySchema, DyeLotSchema, ReadingSchema, type Colourway, type DyeLot, type Role, type Studio } from "@/entities";
import { countWords, quoted, recordActivity } from "@/lib/activity";
import { can } from "@/lib/auth/permissions";
import { badRequest, conflict, forbidden, notFound } from "@/lib/errors";
import type { ColourwayInput, ColourwayPatch, LotInput } from "@/lib/schemas/colourway";
import type { SessionUser } from "@/lib/auth/session";
import { findTrial, getTrial } from "@/lib/trials/trials";

const labOf = (x: { L: number; a: number; b: number }): Lab => ({ L: x.L, a: x.a, b: x.b });

export interface LotDto {
  id: string;
  code: string;
  trialId: string;
  skeins: number;
  fibreWeightG: number;
  lab: Lab | null;
  de00: number | null;
  cmc21: number | null;
  pass: boolean | null;
  misses: string[];
  tolerance: number;
  notes: string;
  createdAt: string;
}

export interface ColourwayDto {
  id: string;
  name: string;
  description: string;
  status: Colourway["status"];
  target: Lab;
  targetPalette: { lab: Lab; share: number }[];
  sourceTrialId: string;
  sourceReadingId: string | null;
  recipe: Record<string, unknown>;
  proposedBy: string;
  approvedAt: string | null;
  version: number;
  passingLots: number;
  lotsNeeded: number;
  lots: LotDto[];
  createdAt: string;
}

function lotDto(l: DyeLot): LotDto {
  return {
    id: l.id,
    code: l.code,
    trialId: l.trial.id,
    skeins: l.skeins,
    fibreWeightG: l.fibreWeightG,
    lab: l.L != null && l.a != null && l.b != null ? { L: l.L, a: l.a, b: l.b } : null,
    de00: l.de00 ?? null,
    cmc21: l.cmc21 ?? null,
    pass: l.pass ?? null,
    misses: l.misses,
    tolerance: l.tolerance,
    notes: l.notes,
    createdAt: l.createdAt.toISOString(),
  };
}

async function dto(em: EntityManager, studio: Studio, c: Colourway): Promise<ColourwayDto> {
  const lots = await em.find(DyeLotSchema, { colourway: c }, { orderBy: { createdAt: "asc" } });
  await em.populate(c, ["proposedBy"]);
  return {
    id: c.id,
    name: c.name,
    description: c.description,
    status: c.status,
    target: { L: c.targetL, a: c.targetA, b: c.targetB },
    targetPalette: c.targetPalette.map((p) => ({ lab: labOf(p), share: p.share })),
    sourceTrialId: c.sourceTrial.id,
    sourceReadingId: c.sourceReading?.id ?? null,
    recipe: c.recipe,
    proposedBy: c.proposedBy.getEntity().name,
    approvedAt: c.approvedAt?.toISOString() ?? null,
    version: c.version,
    passingLots: lots.filter((l) => l.pass).length,
    lotsNeeded: studio.lotsForRepeatable,
    lots: lots.map(lotDto),
    createdAt: c.createdAt.toISOString(),
  };
}

async function findColourway(em: EntityManager, studio: Studio, id: string): Promise<Colourway> {
  const c = await em.findOne(ColourwaySchema, { id, studio });
  if (!c) throw notFound("This colourway");
  return c;
}

export async function listColourways(em: EntityManager, studio: Studio): Promise<ColourwayDto[]> {
  const list = await em.find(ColourwaySchema, { studio }, { orderBy: { updatedAt: "desc" } });
  return Promise.all(list.map((c) => dto(em, studio, c)));
}

export async function getColourway(em: EntityManager, studio: Studio, id: string): Promise<ColourwayDto> {
  return dto(em, studio, await findColourway(em, studio, id));
}

/** A trial's measured result becomes a candidate colourway: its reading is the target, its layers the recipe. */
export async function createColourway(em: EntityManager, studio: Studio, user: SessionUser, input: ColourwayInput): Promise<ColourwayDto> {
  const trial = await findTrial(em, studio, input.trialId);
  const reading = await em.findOne(ReadingSchema, { id: input.readingId, studio, trial });
  if (!reading) throw badRequest("Choose a reading of this trial as the target colour.", { readingId: "Not a reading of this trial." });
  const snapshot = await getTrial(em, studio, trial.id);
  const c = em.create(ColourwaySchema, {
    id: randomUUID(),
    studio,
    name: input.name,
    description: input.description,
    targetL: reading.L,
    targetA: reading.a,
    targetB: reading.b,
    targetPalette: reading.palette,
    sourceTrial: trial,
    sourceReading: reading,
    recipe: { fibreWeightG: snapshot.fibreWeightG, base: snapshot.base, layers: snapshot.layers },
    proposedBy: user.id,
  });
  await recordActivity(em, {
    studio,
    actor: user.id,
    kind: "colourway.created",
    summary: `proposed the colourway ${quoted(c.name)} from ${quoted(trial.title)}`,
    trialId: trial.id,
    colourwayId: c.id,
  });
  await em.flush();
  return dto(em, studio, c);
}

/** Name, description and status. Only owners mark repeatable (with enough passing lots) or retire. */
export async function updateColourway(
  em: EntityManager,
  studio: Studio,
  role: Role,
  user: SessionUser,
  id: string,
  patch: ColourwayPatch,
): Promise<ColourwayDto> {
  const c = await findColourway(em, studio, id);
  if (c.version !== patch.version) {
    throw conflict("Someone else changed this colourway while you were editing. Reload to see their changes, then apply yours again.");
  }
  let becameRepeatable: number | null = null;
  if (patch.status && patch.status !== c.status) {
    if (patch.status !== "candidate" && !can(role, "colourway.approve")) {
      throw forbidden("Only a studio owner can mark a colourway repeatable or retire it.");
    }
    if (patch.status === "repeatable") {
      const passing = await em.count(DyeLotSchema, { colourway: c, pass: true });
      if (passing < studio.lotsForRepeatable) {
        throw conflict(
          `A colourway becomes repeatable after ${studio.lotsForRepeatable} passing dye lots; this one has ${passing}. Dye and measure another lot first.`,
        );
      }
      c.approvedBy = em.getReference("User" as never, user.id as never) as never;
      c.approvedAt = new Date();
      becameRepeatable = passing;
    }
    c.status = patch.status;
  }
  if (patch.name !== undefined) c.name = patch.name;
  if (patch.description !== undefined) c.description = patch.description;
  if (becameRepeatable !== null) {
    // Stored by the same flush, which checks the version: a refused save records nothing.
    await recordActivity(em, {
      studio,
      actor: user.id,
      kind: "colourway.repeatable",
      summary: `marked ${quoted(c.name)} repeatable, after ${countWords(becameRepeatable, "passing lot", "passing lots")}`,
      trialId: c.sourceTrial.id,
      colourwayId: c.id,
    });
  }
  await em.flush();
  return dto(em, studio, c);
}

/** Records a dye lot and judges it against the target at the studio's tolerance (ΔE CMC(2:1)). */
export async function addLot(em: EntityManager, studio: Studio, user: SessionUser, id: string, input: LotInput): Promise<ColourwayDto> {
  const c = await findColourway(em, studio, id);
  const trial = await findTrial(em, studio, input.trialId);
  const reading = input.readingId ? await em.findOne(ReadingSchema, { id: input.readingId, studio }) : null;
  if (input.readingId && !reading) throw badRequest("That reading is not in this studio.", { readingId: "Choose a reading of the lot." });
  const judged = reading
    ? judgeLot({ L: c.targetL, a: c.targetA, b: c.targetB }, labOf(reading), { metric: "cmc21", max: studio.lotTolerance })
    : null;
  const lot = em.create(DyeLotSchema, {
    id: randomUUID(),
    studio,
    colourway: c,
    trial,
    code: input.code,
    skeins: input.skeins,
    fibreWeightG: input.fibreWeightG,
    reading,
    ...(reading ? labOf(reading) : {}),
    de00: judged?.de00 ?? null,
    cmc21: judged?.cmc21 ?? null,
    pass: judged?.pass ?? null,
    misses: judged?.misses ?? [],
    tolerance: studio.lotTolerance,
    notes: input.notes,
    createdBy: user.id,
  });
  const verdict = !judged ? "not measured yet" : judged.pass ? "passed" : `failed${judged.misses.length ? ` (${judged.misses.join(", ")})` : ""}`;
  await recordActivity(em, {
    studio,
    actor: user.id,
    kind: "lot.added",
    summary: `logged lot ${lot.code} of ${quoted(c.name)} — ${verdict}`,
    trialId: trial.id,
    colourwayId: c.id,
    subjectId: lot.id,
  });
  await em.flush();
  return dto(em, studio, c);
}
