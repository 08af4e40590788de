// The demo studio's calibration dyeings and an over-dye in progress, with real photos and readings.
//
// Each calibration trial is one demo dye alone on Heathland DK at 0.25, 1 or 3 % DOS. Its colours
// come from the colour module's invented "true" dyes (colour/spectral/synthetic-dyeings.ts), one
// invented dye standing in for each demo dye; every colour is rendered as a synthetic phone photo
// beside the demo card, stored through the photo pipeline (bucket + variants) and read with the
// card, exactly as a dyer's upload would be. The studio's dye profiles are then fitted from those
// readings, so the demo opens with profiles learnt from its own (invented) measurements.
//
// The over-dye trial has a measured undyed base and a first Marigold layer with its reading; its
// second layer is left for the dyer to plan with the prediction beside it.
import { randomUUID } from "node:crypto";
import type { EntityManager } from "@mikro-orm/postgresql";
import sharp from "sharp";
import { renderPhoto, type Lab } from "../../colour";
import { SYNTHETIC_BASES, syntheticDyeing, trueResult, type SyntheticDyeId } from "../../colour/spectral/synthetic-dyeings";
import { reflectanceToLab } from "../../colour/spectral/reflectance";
import { ActivityEventSchema, LayerSchema, PhotoSchema, TrialSchema, type Layer, type PhotoKind, type ReferenceCard, type Studio, type Trial, type User } from "../../entities";
import { refitProfiles } from "../../lib/learning/profiles";
import { confirmUpload } from "../../lib/photos/photos";
import { createReadings } from "../../lib/photos/readings";
import { putObject } from "../../lib/storage";
import type { DemoLibrary } from "./library";

const BASE = "Heathland DK";
/** Which invented dye plays which demo dye. */
const STAND_INS: Record<string, SyntheticDyeId> = {
  "Harbour Teal": "turquoise",
  Rosehip: "magenta",
  Marigold: "golden-yellow",
  "Slate Black": "black",
};
const DEPTHS = [0.25, 1, 3];
export const CALIBRATION_TAG = "calibration";
export const OVERDYE_TITLE = "Sea glass: marigold under teal";

// Small photos keep the seed quick; the card patches are still ~25 px across.
const W = 600, H = 400;
const SWATCH = { x: 340, y: 110, width: 200, height: 180 };
const READ = { x: 360, y: 130, width: 160, height: 140 };

interface Ctx {
  em: EntityManager;
  studio: Studio;
  user: User;
  card: ReferenceCard;
  seed: number;
}

/** A synthetic photo of `lab` beside the demo card, stored and read like an upload. */
async function photographed(ctx: Ctx, trial: Trial, layer: Layer | null, kind: PhotoKind, lab: Lab): Promise<void> {
  const { em, studio, user, card } = ctx;
  const photo = renderPhoto({ width: W, height: H, seed: ctx.seed++, swatches: [{ spec: { kind: "solid", lab }, rect: SWATCH }] });
  const jpeg = await sharp(photo.data, { raw: { width: W, height: H, channels: 3 } }).jpeg({ quality: 88 }).toBuffer();
  const id = randomUUID();
  const row = em.create(PhotoSchema, { id, studio, trial, layer, kind, uploadedBy: user, status: "pending", uploadKey: `studios/${studio.id}/uploads/${id}` });
  await em.flush();
  await putObject(row.uploadKey, jpeg, "image/jpeg");
  const sessionUser = { id: user.id, email: user.email, name: user.name };
  await confirmUpload(em, studio, sessionUser, row.id);
  await createReadings(em, studio, sessionUser, row.id, { cardId: card.id, corners: photo.gridCorners, regions: [{ label: "", rect: READ }] });
}

function immersion(trial: Trial, position: number, dyes: { dyeId: string; dosPct: number }[], extra: Partial<Layer> = {}) {
  return {
    trial,
    position,
    method: "immersion" as const,
    dyes: dyes.map((d) => ({ dyeId: d.dyeId, stockId: null, dosPct: d.dosPct, entered: { value: d.dosPct, unit: "dos" as const } })),
    acid: { kind: "vinegar" as const, amount: 20, ph: null },
    waterL: 1,
    temperatureC: 90,
    minutes: 30,
    setting: { method: "none" as const, minutes: null },
    ...extra,
  };
}

/**
 * Adds the calibration trials, their photos and readings, the fitted profiles and the over-dye
 * trial, unless the studio has calibration trials already. Returns how many trials were added.
 */
export async function seedCalibration(
  em: EntityManager,
  studio: Studio,
  users: { owner: User; dyer: User },
  library: DemoLibrary,
  card: ReferenceCard,
): Promise<number> {
  const existing = await em.getConnection().execute<{ n: string }[]>(
    "select count(*) as n from trials where studio_id = ? and tags @> ?::jsonb",
    [studio.id, JSON.stringify([CALIBRATION_TAG])],
  );
  if (Number(existing[0].n) > 0) return 0;
  const base = library.bases[BASE];
  if (!base) throw new Error(`The demo library has no base called ${BASE}.`);
  const ctx: Ctx = { em, studio, user: users.dyer, card, seed: 100 };
  const undyed = reflectanceToLab(SYNTHETIC_BASES.white);
  let added = 0;

  const series: string[] = [];
  for (const [dyeName, synthetic] of Object.entries(STAND_INS)) {
    const dye = library.dyes[dyeName];
    if (!dye) throw new Error(`The demo library has no dye called ${dyeName}.`);
    for (const dosPct of DEPTHS) {
      const d = syntheticDyeing(SYNTHETIC_BASES.white, [{ dyeId: synthetic, dosPct }]);
      const trial = em.create(TrialSchema, {
        studio,
        author: users.dyer,
        title: `${dyeName} at ${dosPct} % on ${BASE}`,
        base,
        fibreWeightG: 10,
        status: "done",
        tags: [CALIBRATION_TAG, "depth series"],
        notes: null,
        notesText: "",
      });
      const layer = em.create(LayerSchema, immersion(trial, 0, [{ dyeId: dye.id, dosPct }], { observations: "Bath cleared; rinsed clear." }));
      await em.flush();
      await photographed(ctx, trial, null, "base", d.base);
      await photographed(ctx, trial, layer, "after-layer", d.result);
      series.push(trial.id);
      added++;
    }
  }
  await refitProfiles(em, studio);
  // The photos and readings recorded their feed events as the app does; the depth series was
  // photographed on one afternoon a week and a half ago, so its events are dated then.
  const events = await em.find(ActivityEventSchema, { studio, trialId: { $in: series } }, { orderBy: [{ createdAt: "asc" }, { id: "asc" }] });
  const start = Date.now() - 10 * 86_400_000;
  events.forEach((e, i) => (e.createdAt = new Date(start + i * 5 * 60_000)));
  await em.flush();

  // The over-dye: Marigold at 1 % measured, Harbour Teal over it still to plan.
  const marigold = library.dyes.Marigold;
  const trial = em.create(TrialSchema, {
    studio,
    author: users.owner,
    title: OVERDYE_TITLE,
    base,
    fibreWeightG: 100,
    status: "in-progress",
    tags: ["over-dye", "green"],
    notes: null,
    notesText: "",
  });
  const first = em.create(LayerSchema, immersion(trial, 0, [{ dyeId: marigold.id, dosPct: 1 }], { waterL: 3, observations: "A clear warm yellow." }));
  await em.flush();
  await photographed(ctx, trial, null, "base", undyed);
  await photographed(ctx, trial, first, "after-layer", reflectanceToLab(trueResult(SYNTHETIC_BASES.white, [{ dyeId: "golden-yellow", dosPct: 1 }])));
  return added + 1;
}
