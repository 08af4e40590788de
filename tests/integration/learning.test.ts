// The learning loop against the real database: profiles fitted from the studio's own measured
// dyeings, a recorded prediction for a planned layer, and predicted against measured with a verdict.
// Ground truth comes from the colour module's synthetic dyes (invented K/S spectra, no noise).
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import * as profilesRoute from "@/app/api/studios/[studioId]/profiles/route";
import * as refitRoute from "@/app/api/studios/[studioId]/profiles/refit/route";
import * as predictionRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layers/[layerId]/prediction/route";
import * as comparisonRoute from "@/app/api/studios/[studioId]/trials/[trialId]/comparison/route";
import * as layersRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layers/route";
import * as layerRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layers/[layerId]/route";
import * as activityRoute from "@/app/api/studios/[studioId]/activity/route";
import { deltaE00, reflectanceToLab } from "@/colour";
import { SYNTHETIC_BASES, syntheticDyeing, trueResult } from "@/colour/spectral/synthetic-dyeings";
import { LayerPredictionSchema, LayerSchema } from "@/entities";
import { getEm, getOrm } from "@/lib/db";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";
import { makeReading } from "../support/readings";
import { dosDye, makeBase, makeDye, makeTrial } from "../support/trial-fixtures";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "learning";
let owner: Person, dyer: Person, guest: Person, stranger: Person;
let studio: StudioFixture, other: StudioFixture;
let baseId: string;
const dye: Record<"turquoise" | "magenta" | "golden-yellow", string> = { turquoise: "", magenta: "", "golden-yellow": "" };
let unprofiled: string;
const white = reflectanceToLab(SYNTHETIC_BASES.white);

async function layerIds(trialId: string): Promise<string[]> {
  const em = await getEm();
  return (await em.find(LayerSchema, { trial: trialId }, { orderBy: { position: "asc" } })).map((l) => l.id);
}

/** A measured calibration dyeing: base reading, one immersion layer and its reading. */
async function calibrationTrial(synthetic: keyof typeof dye, dosPct: number) {
  const d = syntheticDyeing(SYNTHETIC_BASES.white, [{ dyeId: synthetic, dosPct }]);
  const trialId = await makeTrial(studio.id, { title: `${synthetic} ${dosPct}`, authorId: dyer.id, baseId, layers: [{ method: "immersion", dyes: [dosDye(dye[synthetic], dosPct)] }] });
  await makeReading(studio.id, trialId, dyer.id, d.base);
  await makeReading(studio.id, trialId, dyer.id, d.result, { layerId: (await layerIds(trialId))[0] });
}

beforeAll(async () => {
  [owner, dyer, guest, stranger] = await Promise.all(["owner", "dyer", "guest", "stranger"].map((n) => makeUser(TAG, n)));
  studio = await makeStudio("Learning Studio", [[owner, "owner"], [dyer, "dyer"], [guest, "guest"]]);
  other = await makeStudio("Learning Elsewhere", [[stranger, "owner"]]);
  baseId = await makeBase(studio.id, "Plain wool", { fibres: [{ fibre: "wool", pct: 100 }] });
  for (const k of Object.keys(dye) as (keyof typeof dye)[]) dye[k] = await makeDye(studio.id, `Test ${k}`);
  unprofiled = await makeDye(studio.id, "Never measured violet");
  for (const k of Object.keys(dye) as (keyof typeof dye)[]) for (const dos of [0.25, 1, 3]) await calibrationTrial(k, dos);
});

afterAll(async () => {
  await (await getOrm()).close();
});

describe("dye profiles", () => {
  it("are fitted from the studio's measured immersion dyeings, per fibre class", async () => {
    actAs(dyer);
    const refit = await call(refitRoute.POST, "POST", { studioId: studio.id });
    expect(refit.status).toBe(200);
    expect(refit.json).toEqual([{ fibreClass: "wool", ok: true, dyes: 3, dyeings: 9 }]);
    const list = await call(profilesRoute.GET, "GET", { studioId: studio.id });
    expect(list.json).toHaveLength(3);
    for (const p of list.json) {
      expect(p.nDyeings).toBe(3);
      expect(p.meanDe00).toBeLessThan(1); // noiseless synthetic dyeings are reproduced closely
    }
    const again = await call(refitRoute.POST, "POST", { studioId: studio.id });
    expect(again.status).toBe(200);
    const after = await call(profilesRoute.GET, "GET", { studioId: studio.id });
    expect(after.json.every((p: { modelVersion: number }) => p.modelVersion === 2)).toBe(true);
  });

  it("cannot be refitted by a guest (403) or read from another studio (404)", async () => {
    actAs(guest);
    expect((await call(refitRoute.POST, "POST", { studioId: studio.id })).status).toBe(403);
    actAs(stranger);
    expect((await call(profilesRoute.GET, "GET", { studioId: studio.id })).status).toBe(404);
  });
});

describe("predict, then compare", () => {
  it("records a prediction of a held-out two-dye mix and compares it with the measured result", async () => {
    actAs(dyer);
    const mix = [{ dyeId: "turquoise", dosPct: 0.6 }, { dyeId: "golden-yellow", dosPct: 1.2 }];
    const truth = reflectanceToLab(trueResult(SYNTHETIC_BASES.white, mix));
    const trialId = await makeTrial(studio.id, {
      title: "Held-out green",
      authorId: dyer.id,
      baseId,
      layers: [{ method: "immersion", dyes: [dosDye(dye.turquoise, 0.6), dosDye(dye["golden-yellow"], 1.2)] }],
    });
    const [layerId] = await layerIds(trialId);
    const noBase = await call(predictionRoute.POST, "POST", { studioId: studio.id, trialId, layerId });
    expect(noBase.status).toBe(422);
    expect(noBase.json.error).toMatch(/base first/);
    await makeReading(studio.id, trialId, dyer.id, white);
    const pred = await call(predictionRoute.POST, "POST", { studioId: studio.id, trialId, layerId });
    expect(pred.status).toBe(201);
    const err = deltaE00(pred.json.lab, truth);
    console.log(`held-out two-dye mix: predicted vs true ΔE00 ${err.toFixed(2)}`);
    expect(err).toBeLessThan(1.5);
    expect(pred.json.profileVersions[dye.turquoise]).toBeGreaterThanOrEqual(1);

    await makeReading(studio.id, trialId, dyer.id, truth, { layerId });
    const cmp = await call(comparisonRoute.GET, "GET", { studioId: studio.id, trialId });
    expect(cmp.status).toBe(200);
    expect(cmp.json[0].verdict.de00).toBeCloseTo(err, 6);
    expect(cmp.json[0].verdict.verdict).toBe("close"); // ≤ 2 ΔE00, our product band
    // The prediction made before the result was known is kept.
    const late = await call(predictionRoute.POST, "POST", { studioId: studio.id, trialId, layerId });
    expect(late.status).toBe(409);
    expect(late.json.error).toMatch(/measured/);
  });

  it("names the dye without a profile instead of guessing", async () => {
    actAs(dyer);
    const trialId = await makeTrial(studio.id, { title: "Violet try", authorId: dyer.id, baseId, layers: [{ method: "immersion", dyes: [dosDye(unprofiled, 1)] }] });
    await makeReading(studio.id, trialId, dyer.id, white);
    const [layerId] = await layerIds(trialId);
    const res = await call(predictionRoute.POST, "POST", { studioId: studio.id, trialId, layerId });
    expect(res.status).toBe(422);
    expect(res.json.error).toContain("Never measured violet");
    actAs(guest);
    expect((await call(predictionRoute.POST, "POST", { studioId: studio.id, trialId, layerId })).status).toBe(403);
    actAs(stranger);
    expect((await call(comparisonRoute.GET, "GET", { studioId: other.id, trialId })).status).toBe(404);
  });

  it("keeps what the model said when a layer is planned, refreshes it while unmeasured, never after", async () => {
    actAs(dyer);
    const trialId = await makeTrial(studio.id, { title: "Planned over-dye", authorId: dyer.id, baseId });
    await makeReading(studio.id, trialId, dyer.id, white);
    const predictionsOf = async (layerId: string) => (await getEm()).count(LayerPredictionSchema, { layer: layerId });
    const body = { method: "immersion", dyes: [{ dyeId: dye.magenta, amount: { value: 0.5, unit: "dos" } }] };
    const added = await call(layersRoute.POST, "POST", { studioId: studio.id, trialId }, { body });
    expect(added.status, JSON.stringify(added.json)).toBe(201);
    const layer = added.json.layers[0];
    expect(await predictionsOf(layer.id)).toBe(1);
    const first = await call(comparisonRoute.GET, "GET", { studioId: studio.id, trialId });
    const half = first.json[0].prediction.lab;

    // A deeper amount before dyeing: a fresh, darker prediction.
    const deeper = { version: layer.version, dyes: [{ dyeId: dye.magenta, amount: { value: 2, unit: "dos" } }] };
    const patched = await call(layerRoute.PATCH, "PATCH", { studioId: studio.id, trialId, layerId: layer.id }, { body: deeper });
    expect(patched.status, JSON.stringify(patched.json)).toBe(200);
    expect(await predictionsOf(layer.id)).toBe(2);
    const second = await call(comparisonRoute.GET, "GET", { studioId: studio.id, trialId });
    expect(second.json[0].prediction.lab.L).toBeLessThan(half.L - 5);

    // Once measured, a later edit (here: the notes of what was seen) leaves the prediction alone.
    const truth = reflectanceToLab(trueResult(SYNTHETIC_BASES.white, [{ dyeId: "magenta", dosPct: 2 }]));
    await makeReading(studio.id, trialId, dyer.id, truth, { layerId: layer.id });
    const measuredLayer = patched.json.layers[0];
    const again = { version: measuredLayer.version, dyes: deeper.dyes, observations: "Deep raspberry." };
    expect((await call(layerRoute.PATCH, "PATCH", { studioId: studio.id, trialId, layerId: layer.id }, { body: again })).status).toBe(200);
    expect(await predictionsOf(layer.id)).toBe(2);
    const cmp = await call(comparisonRoute.GET, "GET", { studioId: studio.id, trialId });
    expect(cmp.json[0].verdict.verdict).toBe("close");
  });

  it("puts a prediction someone asked for in the feed, not the ones recorded when a layer is saved or refused", async () => {
    actAs(dyer);
    const trialId = await makeTrial(studio.id, { title: "Asked-for teal", authorId: dyer.id, baseId });
    await makeReading(studio.id, trialId, dyer.id, white);
    const feed = async () => {
      const res = await activityRoute.GET(new Request(`http://127.0.0.1/api/x?trialId=${trialId}`), { params: Promise.resolve({ studioId: studio.id }) });
      return (await res.json()).items as { kind: string; actor: { id: string }; summary: string; layerId: string | null; subjectId: string | null }[];
    };
    const body = { method: "kettle", dyes: [{ dyeId: dye.turquoise, amount: { value: 1, unit: "dos" } }] };
    const added = await call(layersRoute.POST, "POST", { studioId: studio.id, trialId }, { body });
    const layerId = added.json.layers[0].id;
    const em = await getEm();
    expect(await em.count(LayerPredictionSchema, { layer: layerId })).toBe(1); // recorded by the server on its own
    expect((await feed()).map((e) => e.kind)).toEqual(["layer.added"]);

    actAs(owner);
    const asked = await call(predictionRoute.POST, "POST", { studioId: studio.id, trialId, layerId });
    expect(asked.status).toBe(201);
    const [latest] = await feed();
    expect(latest).toMatchObject({ kind: "prediction.made", actor: { id: owner.id }, summary: "predicted the colour of layer 1 (kettle) of “Asked-for teal”", layerId });
    const stored = await em.fork().find(LayerPredictionSchema, { layer: layerId }, { orderBy: { createdAt: "desc" } });
    expect(latest.subjectId).toBe(stored[0].id);

    // Refused requests record nothing: a dye without a profile (422), a measured layer (409).
    const violet = await call(layersRoute.POST, "POST", { studioId: studio.id, trialId }, { body: { method: "dip", dyes: [{ dyeId: unprofiled, amount: { value: 1, unit: "dos" } }] } });
    const violetId = violet.json.layers[1].id;
    expect((await call(predictionRoute.POST, "POST", { studioId: studio.id, trialId, layerId: violetId })).status).toBe(422);
    await makeReading(studio.id, trialId, dyer.id, white, { layerId });
    expect((await call(predictionRoute.POST, "POST", { studioId: studio.id, trialId, layerId })).status).toBe(409);
    expect((await feed()).map((e) => e.kind)).toEqual(["layer.added", "prediction.made", "layer.added"]);
  });

  it("adds a layer without a prediction when none can be made", async () => {
    actAs(dyer);
    const trialId = await makeTrial(studio.id, { title: "No base measured", authorId: dyer.id, baseId });
    const body = { method: "immersion", dyes: [{ dyeId: dye.magenta, amount: { value: 1, unit: "dos" } }] };
    const added = await call(layersRoute.POST, "POST", { studioId: studio.id, trialId }, { body });
    expect(added.status).toBe(201);
    expect(await (await getEm()).count(LayerPredictionSchema, { layer: added.json.layers[0].id })).toBe(0);
  });
});
