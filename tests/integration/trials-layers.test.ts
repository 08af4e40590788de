// Layers through their routes: amounts converted with the colour module's arithmetic, edits with
// the layer's version, duplicate, delete and reorder keeping positions 0..n-1, warnings, 422s.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import * as trialsRoute from "@/app/api/studios/[studioId]/trials/route";
import * as trialRoute from "@/app/api/studios/[studioId]/trials/[trialId]/route";
import * as layersRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layers/route";
import * as layerRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layers/[layerId]/route";
import * as duplicateRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layers/[layerId]/duplicate/route";
import * as orderRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layer-order/route";
import { dosFromStockMl, dyeGrams, stockMl } from "@/colour/arithmetic";
import { US_CUP_ML, US_TBSP_ML, US_TSP_ML } from "@/colour/measures";
import { getOrm } from "@/lib/db";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";
import { makeBase, makeDye, makeStock } from "../support/trial-fixtures";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "trials-layers";
let dyer: Person;
let studio: StudioFixture;
let other: StudioFixture;
let lib: { wool: string; blend: string; sw: string; teal: string; rust: string; stock1: string; stock01: string; oldStock: string; rustStock: string; foreignDye: string; foreignStock: string };

beforeAll(async () => {
  const stranger = await makeUser(TAG, "stranger");
  dyer = await makeUser(TAG, "dyer");
  studio = await makeStudio("Layer Studio", [[dyer, "dyer"]]);
  other = await makeStudio("Other Layer Studio", [[stranger, "owner"]]);
  const teal = await makeDye(studio.id, "Layer Teal", { displayHex: "#1f7a7a" });
  const rust = await makeDye(studio.id, "Layer Rust", { dyeClass: "food", form: "liquid" });
  const foreignDye = await makeDye(other.id, "Foreign Dye");
  lib = {
    wool: await makeBase(studio.id, "Layer Wool"),
    blend: await makeBase(studio.id, "Wool Cotton", { fibres: [{ fibre: "wool", pct: 70 }, { fibre: "cotton", pct: 30 }] }),
    sw: await makeBase(studio.id, "Superwash Sock", { fibres: [{ fibre: "superwash wool", pct: 100 }], superwash: true }),
    teal,
    rust,
    stock1: await makeStock(studio.id, teal, { pct: 1 }),
    stock01: await makeStock(studio.id, teal, { pct: 0.1 }),
    oldStock: await makeStock(studio.id, teal, { pct: 1, mixedOn: "2020-01-01" }),
    rustStock: await makeStock(studio.id, rust, { pct: 1 }),
    foreignDye,
    foreignStock: await makeStock(other.id, foreignDye),
  };
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

const tp = (trialId: string) => ({ studioId: studio.id, trialId });
const lp = (trialId: string, layerId: string) => ({ studioId: studio.id, trialId, layerId });

async function trial(fibreWeightG: number, baseId: string | null = lib.wool) {
  actAs(dyer);
  const res = await call(trialsRoute.POST, "POST", { studioId: studio.id }, { body: { title: `Layers on ${fibreWeightG} g`, fibreWeightG, baseId } });
  expect(res.status).toBe(201);
  return res.json;
}

async function add(trialId: string, body: object, status = 201) {
  const res = await call(layersRoute.POST, "POST", tp(trialId), { body: { method: "immersion", ...body } });
  expect(res.status, JSON.stringify(res.json)).toBe(status);
  return res.json;
}

describe("dye amounts match the colour module (DOMAIN.md check values, common practice)", () => {
  it("100 g at 1 % with a 1 % stock is 100 ml and 1 g", async () => {
    const t = await trial(100);
    const out = await add(t.id, { dyes: [{ dyeId: lib.teal, stockId: lib.stock1, amount: { value: 1, unit: "dos" } }] });
    const d = out.layers[0].dyes[0];
    expect(d.dosPct).toBe(1);
    expect(d.stockMl).toBeCloseTo(100, 12);
    expect(d.grams).toBeCloseTo(1, 12);
    expect(d).toMatchObject({ dyeName: "Layer Teal", displayHex: "#1f7a7a", dyeClass: "acid", stockPct: 1, stockDefinition: "to-volume" });
  });

  it("454 g at 2 % is 908 ml of 1 % stock; 454 g at 0.1 % is 45.4 ml of 1 % or 454 ml of 0.1 %", async () => {
    const t = await trial(454);
    const out = await add(t.id, {
      dyes: [
        { dyeId: lib.teal, stockId: lib.stock1, amount: { value: 2, unit: "dos" } },
        { dyeId: lib.teal, stockId: lib.stock1, amount: { value: 0.1, unit: "dos" } },
        { dyeId: lib.teal, stockId: lib.stock01, amount: { value: 0.1, unit: "dos" } },
      ],
    });
    const [a, b, c] = out.layers[0].dyes;
    expect(a.stockMl).toBeCloseTo(908, 9);
    expect(b.stockMl).toBeCloseTo(45.4, 9);
    expect(c.stockMl).toBeCloseTo(454, 9);
    expect(a.grams).toBeCloseTo(9.08, 12);
  });

  it("908 ml of 1 % stock entered on 454 g reads back as 2 % DOS", async () => {
    const t = await trial(454);
    const out = await add(t.id, { dyes: [{ dyeId: lib.teal, stockId: lib.stock1, amount: { value: 908, unit: "ml" } }] });
    const d = out.layers[0].dyes[0];
    expect(d.dosPct).toBeCloseTo(2, 12);
    expect(d.entered).toEqual({ value: 908, unit: "ml" });
    expect(d.stockMl).toBeCloseTo(908, 9);
  });

  it("kitchen measures are US customary volumes of the stock (NIST Handbook 44, Appendix C)", async () => {
    const t = await trial(100);
    const out = await add(t.id, {
      dyes: [
        { dyeId: lib.teal, stockId: lib.stock1, amount: { value: 2, unit: "tsp" } },
        { dyeId: lib.teal, stockId: lib.stock1, amount: { value: 1, unit: "tbsp" } },
        { dyeId: lib.rust, stockId: lib.rustStock, amount: { value: 0.25, unit: "cup" } },
        { dyeId: lib.rust, stockId: lib.rustStock, amount: { value: 1, unit: "floz" } },
      ],
    });
    const [tsp, tbsp, cup, floz] = out.layers[0].dyes;
    // 2 tsp = 9.8578431875 ml of 1 % stock = 0.098578… g on 100 g → 0.0986 % DOS.
    expect(tsp.stockMl).toBeCloseTo(2 * US_TSP_ML, 9);
    expect(tsp.dosPct).toBeCloseTo(dosFromStockMl(100, 2 * US_TSP_ML, 1), 12);
    expect(tsp.dosPct).toBeCloseTo(0.098578431875, 12);
    expect(tbsp.stockMl).toBeCloseTo(US_TBSP_ML, 9);
    expect(cup.stockMl).toBeCloseTo(US_CUP_ML / 4, 9);
    expect(cup.grams).toBeCloseTo((US_CUP_ML / 4) * 0.01, 12);
    expect(floz.stockMl).toBeCloseTo(29.5735295625, 9);
  });

  it("grams of powder need no stock; an 'in water' stock holds x g per 100 + x ml", async () => {
    const inWater = await makeStock(studio.id, lib.teal, { pct: 1, definition: "in-water" });
    const t = await trial(250);
    const out = await add(t.id, {
      dyes: [
        { dyeId: lib.teal, amount: { value: 2.5, unit: "g" } },
        { dyeId: lib.teal, stockId: inWater, amount: { value: 1, unit: "dos" } },
      ],
    });
    const [g, w] = out.layers[0].dyes;
    expect(g.dosPct).toBeCloseTo(1, 12);
    expect(g.stockMl).toBeNull();
    expect(g.grams).toBeCloseTo(dyeGrams(250, 1), 12);
    expect(w.stockMl).toBeCloseTo(stockMl(250, 1, 1, "in-water"), 9);
    expect(w.stockMl).toBeCloseTo(252.5, 9);
  });

  it("water gives the liquor ratio: 100 g in 4 l is 1:40 (DOMAIN.md)", async () => {
    const t = await trial(100);
    const out = await add(t.id, { waterL: 4 });
    expect(out.layers[0].liquorRatio).toBeCloseTo(40, 12);
  });
});

describe("422 with a message per field", () => {
  const cases: [string, object, string, RegExp][] = [
    ["unknown method", { method: "boil" }, "method", /immersion, kettle, dip/],
    ["DOS over 20 %", { dyes: [{ dyeId: "00000000-0000-4000-8000-000000000001", amount: { value: 25, unit: "dos" } }] }, "dyes.0.amount.value", /0 to 20 %/],
    ["negative amount", { dyes: [{ dyeId: "00000000-0000-4000-8000-000000000001", amount: { value: -1, unit: "g" } }] }, "dyes.0.amount.value", /zero or more/],
    ["unknown unit", { dyes: [{ dyeId: "00000000-0000-4000-8000-000000000001", amount: { value: 1, unit: "pinch" } }] }, "dyes.0.amount.unit", /DOS %, ml, g, tsp/],
    ["volume without a stock", { dyes: [{ dyeId: "00000000-0000-4000-8000-000000000001", amount: { value: 2, unit: "tsp" } }] }, "dyes.0.stockId", /volumes of stock/],
    ["dye not an id", { dyes: [{ dyeId: "teal", amount: { value: 1, unit: "dos" } }] }, "dyes.0.dyeId", /Choose a dye/],
    ["coverage above 1", { coverage: 1.5 }, "coverage", /0 \(none\) to 1/],
    ["temperature above 130", { temperatureC: 212 }, "temperatureC", /−10 to 130 °C/],
    ["temperature below −10", { temperatureC: -40 }, "temperatureC", /−10 to 130 °C/],
    ["no water", { waterL: 0 }, "waterL", /litres/],
    ["negative minutes", { minutes: -5 }, "minutes", /minutes/],
    ["pH off the scale", { acid: { kind: "vinegar", ph: 15 } }, "acid.ph", /0 to 14/],
    ["unknown acid", { acid: { kind: "lemon" } }, "acid.kind", /vinegar, citric acid or none/],
    ["unknown setting", { setting: { method: "bake" } }, "setting.method", /simmer, steam, microwave/],
    ["gradient depths short", { gradient: { sections: 4, depths: [1, 0.5] } }, "gradient.depths", /one depth for each section/],
    ["gradient of one section", { gradient: { sections: 1, depths: [1] } }, "gradient.sections", /at least 2/],
    ["bled as text", { bled: "yes" }, "bled", /yes or no/],
  ];
  it.each(cases)("%s", async (_n, body, field, message) => {
    const t = await trial(100);
    const res = await add(t.id, body, 422);
    expect(res.fields[field]).toMatch(message);
  });

  it("a dye or stock from another studio, and a stock of another dye", async () => {
    const t = await trial(100);
    const a = await add(t.id, { dyes: [{ dyeId: lib.foreignDye, amount: { value: 1, unit: "dos" } }] }, 422);
    expect(a.fields["dyes.0.dyeId"]).toMatch(/this studio's library/);
    const b = await add(t.id, { dyes: [{ dyeId: lib.teal, stockId: lib.foreignStock, amount: { value: 5, unit: "ml" } }] }, 422);
    expect(b.fields["dyes.0.stockId"]).toMatch(/this studio's library/);
    const c = await add(t.id, { dyes: [{ dyeId: lib.teal, stockId: lib.rustStock, amount: { value: 5, unit: "ml" } }] }, 422);
    expect(c.fields["dyes.0.stockId"]).toMatch(/another dye/);
  });

  it("an entered volume that works out above 20 % DOS", async () => {
    const t = await trial(10);
    // 500 ml of 1 % stock is 5 g of dye: 50 % on 10 g.
    const res = await add(t.id, { dyes: [{ dyeId: lib.teal, stockId: lib.stock1, amount: { value: 500, unit: "ml" } }] }, 422);
    expect(res.fields["dyes.0.amount.value"]).toMatch(/50 % depth of shade on 10 g/);
  });
});

describe("edit with the layer's version", () => {
  it("saves with the current version, refuses the stale one, and moves the trial's updatedAt only", async () => {
    const t = await trial(100);
    const one = await add(t.id, { temperatureC: 85 });
    const layer = one.layers[0];
    await new Promise((r) => setTimeout(r, 20));
    const ok = await call(layerRoute.PATCH, "PATCH", lp(t.id, layer.id), {
      body: { version: layer.version, temperatureC: 92, observations: "Blue broke out at the tips", dyes: [{ dyeId: lib.teal, amount: { value: 0.5, unit: "dos" } }] },
    });
    expect(ok.status).toBe(200);
    const saved = ok.json.layers[0];
    expect(saved).toMatchObject({ temperatureC: 92, observations: "Blue broke out at the tips", version: layer.version + 1, method: "immersion" });
    expect(saved.dyes[0].dosPct).toBe(0.5);
    expect(ok.json.version).toBe(t.version);
    expect(Date.parse(ok.json.updatedAt)).toBeGreaterThan(Date.parse(one.updatedAt));
    const stale = await call(layerRoute.PATCH, "PATCH", lp(t.id, layer.id), { body: { version: layer.version, temperatureC: 60 } });
    expect(stale.status).toBe(409);
    expect(stale.json.error).toMatch(/Someone else saved this/);
    const missing = await call(layerRoute.PATCH, "PATCH", lp(t.id, layer.id), { body: { temperatureC: 60 } });
    expect(missing.status).toBe(422);
    expect(missing.json.fields.version).toMatch(/Reload/);
  });

  it("a trial edit with the version seen before a layer change still saves", async () => {
    const t = await trial(100);
    await add(t.id, {});
    const res = await call(trialRoute.PATCH, "PATCH", tp(t.id), { body: { version: t.version, title: "Renamed after a layer" } });
    expect(res.status).toBe(200);
  });

  it("a layer of another trial answers 404", async () => {
    const a = await trial(100);
    const b = await trial(100);
    const la = (await add(a.id, {})).layers[0];
    const res = await call(layerRoute.PATCH, "PATCH", lp(b.id, la.id), { body: { version: la.version, minutes: 3 } });
    expect(res.status).toBe(404);
  });
});

describe("duplicate, delete and reorder keep positions 0..n-1", () => {
  it("works through a sequence of changes", async () => {
    const t = await trial(100);
    await add(t.id, { method: "dip", gradient: { sections: 4, depths: [1, 0.6, 0.3, 0.1] } });
    await add(t.id, { method: "dry", coverage: 0.3 });
    let out = await add(t.id, { method: "speckle", coverage: 0.15 });
    const [dip, dry, speckle] = out.layers;
    expect(out.layers.map((l: { position: number }) => l.position)).toEqual([0, 1, 2]);

    const dup = await call(duplicateRoute.POST, "POST", lp(t.id, dip.id));
    expect(dup.status).toBe(201);
    out = dup.json;
    expect(out.layers.map((l: { method: string }) => l.method)).toEqual(["dip", "dip", "dry", "speckle"]);
    expect(out.layers.map((l: { position: number }) => l.position)).toEqual([0, 1, 2, 3]);
    expect(out.layers[1].gradient).toEqual({ sections: 4, depths: [1, 0.6, 0.3, 0.1] });
    expect(out.layers[1].id).not.toBe(dip.id);
    const copyId = out.layers[1].id;

    const order = [speckle.id, copyId, dry.id, dip.id];
    const re = await call(orderRoute.PUT, "PUT", tp(t.id), { body: { layerIds: order } });
    expect(re.status).toBe(200);
    expect(re.json.layers.map((l: { id: string }) => l.id)).toEqual(order);
    expect(re.json.layers.map((l: { position: number }) => l.position)).toEqual([0, 1, 2, 3]);
    // Moving a layer does not change its content, so its version stays.
    expect(re.json.layers[0].version).toBe(speckle.version);

    const del = await call(layerRoute.DELETE, "DELETE", lp(t.id, copyId));
    expect(del.status).toBe(200);
    expect(del.json.layers.map((l: { id: string }) => l.id)).toEqual([speckle.id, dry.id, dip.id]);
    expect(del.json.layers.map((l: { position: number }) => l.position)).toEqual([0, 1, 2]);
  });

  it("a reorder that misses a layer is a 409; a repeated id is a 422", async () => {
    const t = await trial(100);
    await add(t.id, {});
    const out = await add(t.id, {});
    const [a, b] = out.layers;
    const missing = await call(orderRoute.PUT, "PUT", tp(t.id), { body: { layerIds: [b.id] } });
    expect(missing.status).toBe(409);
    expect(missing.json.error).toMatch(/layers changed/);
    const twice = await call(orderRoute.PUT, "PUT", tp(t.id), { body: { layerIds: [a.id, a.id] } });
    expect(twice.status).toBe(422);
    expect(twice.json.fields.layerIds).toMatch(/only once/);
    const empty = await call(orderRoute.PUT, "PUT", tp(t.id), { body: { layerIds: [] } });
    expect(empty.status).toBe(422);
  });
});

describe("warnings in context", () => {
  it("fibre that acid dye will not take, an old stock, a superwash boil", async () => {
    const blend = await trial(100, lib.blend);
    const w1 = (await add(blend.id, { dyes: [{ dyeId: lib.teal, stockId: lib.oldStock, amount: { value: 10, unit: "ml" } }] })).warnings;
    expect(w1.map((w: { kind: string }) => w.kind).sort()).toEqual(["fibre-dye", "stock-age"]);
    expect(w1.find((w: { kind: string }) => w.kind === "fibre-dye").message).toMatch(/30 % cotton in Wool Cotton will stay pale/);
    const sw = await trial(100, lib.sw);
    const w2 = (await add(sw.id, { temperatureC: 98, minutes: 60 })).warnings;
    expect(w2).toHaveLength(1);
    expect(w2[0].message).toMatch(/superwash.*60 minutes at 98 °C/);
    const calm = (await add(sw.id, { temperatureC: 85, minutes: 40 })).warnings;
    expect(calm).toHaveLength(1);
  });

  it("the layers carry their safety cautions", async () => {
    const t = await trial(100);
    const out = await add(t.id, { method: "speckle", setting: { method: "steam", minutes: 20 }, dyes: [{ dyeId: lib.teal, amount: { value: 0.2, unit: "g" } }] });
    expect(out.layers[0].cautions).toEqual(["powder", "acid", "steam", "disposal"]);
    const plain = await add(t.id, { acid: { kind: "none" } });
    expect(plain.layers[1].cautions).toEqual([]);
  });
});
