// The learning loop on a phone: plan an over-dye on a trial whose base is measured and watch the
// prediction follow the depth of shade; photograph the dyed skein and compare predicted with
// measured; propose the result as a colourway; record a passing and a failing dye lot; the owner can
// mark it repeatable only once enough lots pass; and the recipe card prints for 800 g.
//
// Colours: the demo studio's profiles are fitted by the seed from synthetic calibration photos of
// invented dyes (colour/spectral/synthetic-dyeings.ts; Rosehip stands in for the invented magenta).
// The "dyed" skein here is that same invented dye at a lower uptake than planned, so the measured
// colour is a little lighter than predicted, as an under-exhausted bath would be.
import { randomUUID } from "node:crypto";
import { type Page, expect, test } from "@playwright/test";
import { deltaE00, reflectanceToLab, type Lab } from "@/colour";
import { SYNTHETIC_BASES, trueResult } from "@/colour/spectral/synthetic-dyeings";
import { authFile, layoutFaults, projectContext, shot } from "./helpers";
import { markAndRead, parseLab, photographViaApi, swatchPhoto } from "./photo-steps";

test.use({ storageState: authFile("dyer") });

const UNDYED = reflectanceToLab(SYNTHETIC_BASES.white);
/** What came out of the pot: 1.5 % Rosehip planned, 85 % of it taken up. */
const DYED = reflectanceToLab(trueResult(SYNTHETIC_BASES.white, [{ dyeId: "magenta", dosPct: 1.5 }], 0.85));
/** A later lot dyed much too pale. */
const PALE = reflectanceToLab(trueResult(SYNTHETIC_BASES.white, [{ dyeId: "magenta", dosPct: 0.6 }]));

async function studioId(page: Page): Promise<string> {
  await page.goto("/");
  await expect(page).toHaveURL(/\/s\/[0-9a-f-]{36}$/);
  return page.url().match(/\/s\/([0-9a-f-]{36})/)![1];
}

async function predictedLab(page: Page): Promise<Lab> {
  const box = page.getByTestId("layer-prediction");
  return parseLab(await box.getByText(/^L\* /).innerText());
}

test("predict an over-dye, compare with the dyed skein, turn it into a colourway with lots", async ({ page, browser }, info) => {
  test.setTimeout(300_000);
  const mark = randomUUID().slice(0, 6);
  const sid = await studioId(page);
  const bases = (await (await page.request.get(`/api/studios/${sid}/bases`)).json()) as { id: string; name: string }[];
  const heathland = bases.find((b) => b.name === "Heathland DK")!;
  const newTrial = async (title: string) => {
    const res = await page.request.post(`/api/studios/${sid}/trials`, { data: { title, baseId: heathland.id, fibreWeightG: 100 } });
    expect(res.status(), await res.text()).toBe(201);
    return ((await res.json()) as { id: string }).id;
  };

  // Set-up: a trial on Heathland DK whose undyed base has been photographed and read.
  const title = `Rosehip over-dye ${mark}`;
  const trialId = await newTrial(title);
  await photographViaApi(page.request, sid, { trialId, kind: "base" }, await swatchPhoto(UNDYED, 31));

  // ---- plan the layer: the prediction follows the depth of shade as it is typed
  await page.goto(`/s/${sid}/trials/${trialId}`);
  await page.getByRole("link", { name: "+ Add a layer" }).click();
  await page.getByRole("radio", { name: /^Immersion/ }).click();
  await page.getByRole("button", { name: "Rosehip" }).click();
  await page.getByRole("radio", { name: /^Powder/ }).click();
  await page.getByRole("radio", { name: "DOS %" }).click();
  const amount = page.getByLabel("How much (DOS %)");
  await amount.fill("0.5");
  const prediction = page.getByTestId("layer-prediction");
  await expect(prediction).toContainText("Over the base's reading");
  const light = await predictedLab(page);
  await amount.fill("1.5");
  await expect.poll(async () => (await predictedLab(page)).L).toBeLessThan(light.L - 5);
  const deep = await predictedLab(page);
  expect(deep.a).toBeGreaterThan(light.a); // deeper Rosehip: redder as well as darker
  await prediction.scrollIntoViewIfNeeded();
  await shot(page, info, "learning-plan");
  if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);
  await page.getByRole("button", { name: "Add Rosehip" }).click();
  await page.getByRole("button", { name: "Next: acid and heat" }).click();
  await page.getByRole("button", { name: "Save layer" }).click();
  await expect(page.getByRole("heading", { name: title })).toBeVisible();
  await expect(page.getByText(/Waiting to send/)).toHaveCount(0, { timeout: 60_000 });

  // The prediction was kept when the layer was saved.
  const comparison = page.getByRole("region", { name: "Predicted and measured" });
  await expect(comparison.getByRole("img", { name: "Predicted colour" })).toBeVisible();
  await expect(comparison.getByText("No reading of this layer yet")).toBeVisible();

  // ---- photograph the dyed skein and read it on the measure page
  const dyedPhoto = await swatchPhoto(DYED, 32);
  await expect(page.getByLabel("The photo shows")).toHaveValue("after-layer");
  await page.getByLabel("Photo file").setInputFiles({ name: "dyed.jpg", mimeType: "image/jpeg", buffer: dyedPhoto.jpeg });
  await page.getByRole("img", { name: "After a layer" }).click({ timeout: 30_000 });
  await markAndRead(page, dyedPhoto);
  await page.getByRole("link", { name: "← Back to the trial" }).click();

  // ---- predicted against measured, in plain words
  const verdict = comparison.getByTestId("verdict");
  await expect(verdict).toBeVisible({ timeout: 30_000 });
  // The page shows what the server recorded; the verdict is CIEDE2000 between the two.
  const server = (await (await page.request.get(`/api/studios/${sid}/trials/${trialId}/comparison`)).json()) as {
    prediction: { lab: Lab };
    measured: { lab: Lab };
    verdict: { de00: number; verdict: string };
  }[];
  const { prediction: p, measured: m, verdict: v } = server[0];
  const f1 = (n: number) => (Math.abs(n) < 0.05 ? "0.0" : n.toFixed(1));
  const shown = (lab: Lab) => `L* ${f1(lab.L)} · a* ${f1(lab.a)} · b* ${f1(lab.b)}`;
  await expect(comparison.getByText(shown(p.lab))).toBeVisible();
  await expect(comparison.getByText(shown(m.lab))).toBeVisible();
  expect(deltaE00(m.lab, DYED)).toBeLessThan(2); // the reading finds the skein's colour
  const de = deltaE00(p.lab, m.lab);
  expect(v.de00).toBeCloseTo(de, 6);
  await expect(verdict).toContainText(`ΔE00 ${de.toFixed(1)}`);
  await expect(verdict).toContainText(de <= 2 ? "Close to the prediction" : de <= 5 ? "A noticeable difference" : "Far from the prediction");
  await expect(verdict).toContainText("lighter"); // less dye taken up than planned
  info.annotations.push({ type: "predicted vs measured ΔE00", description: de.toFixed(2) });
  await comparison.scrollIntoViewIfNeeded();
  await shot(page, info, "learning-compare");

  // ---- propose the result as a colourway
  await comparison.getByRole("button", { name: "Make this a colourway" }).click();
  const name = `Rosehip blush ${mark}`;
  await page.getByLabel("Colourway name").fill(name);
  await page.getByLabel("Description (optional)").fill("A soft pink over the undyed DK.");
  await page.getByRole("button", { name: "Propose colourway" }).click();
  await expect(page.getByRole("heading", { name, level: 1 })).toBeVisible();
  const colourwayUrl = page.url();
  await expect(page.getByTestId("colourway-status")).toContainText("0 of 2 passing lots");

  // Two more dyeings of it: one right on (the same photo read again), one far too pale.
  const again = await newTrial(`${name} lot B`);
  await photographViaApi(page.request, sid, { trialId: again, kind: "final" }, dyedPhoto);
  const pale = await newTrial(`${name} lot C`);
  await photographViaApi(page.request, sid, { trialId: pale, kind: "final" }, await swatchPhoto(PALE, 33));

  // ---- lots: the first passes, the pale one fails and says which way it missed
  const addLot = async (trial: string, code: string) => {
    await page.getByLabel("Trial that dyed the lot").selectOption({ label: trial });
    await expect(page.getByLabel("Reading of the lot")).not.toHaveValue("");
    await page.getByLabel("Lot code").fill(code);
    await page.getByLabel("Skeins").fill("4");
    await page.getByLabel("Fibre (g)").fill("400");
    await page.getByRole("button", { name: "Add lot" }).click();
    await expect(page.getByTestId(`lot-${code}`)).toBeVisible();
  };
  await page.reload();
  await addLot(title, `A-${mark}`);
  await expect(page.getByTestId(`lot-A-${mark}`)).toContainText("Pass");
  await addLot(`${name} lot C`, `C-${mark}`);
  const failed = page.getByTestId(`lot-C-${mark}`);
  await expect(failed).toContainText("Fail");
  await expect(failed).toContainText(/Missed: .*lighter/);
  await expect(page.getByTestId("colourway-status")).toContainText("1 of 2 passing lots");
  await failed.scrollIntoViewIfNeeded();
  await shot(page, info, "learning-lots");
  if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);
  // A dyer proposes; only an owner can mark a colourway repeatable.
  await expect(page.getByRole("button", { name: "Mark repeatable" })).toHaveCount(0);

  // ---- the owner: refused below two passing lots, accepted after the second
  const ownerCtx = await browser.newContext({ ...projectContext(info), storageState: authFile("owner") });
  const owner = await ownerCtx.newPage();
  await owner.goto(colourwayUrl);
  await owner.getByRole("button", { name: "Mark repeatable" }).click();
  await expect(owner.getByText("becomes repeatable after 2 passing dye lots; this one has 1", { exact: false })).toBeVisible();
  await expect(owner.getByTestId("colourway-status")).toContainText("Candidate");
  await shot(owner, info, "learning-refused");

  await addLot(`${name} lot B`, `B-${mark}`);
  await expect(page.getByTestId(`lot-B-${mark}`)).toContainText("Pass");
  await expect(page.getByTestId("colourway-status")).toContainText("2 of 2 passing lots");
  await owner.reload();
  await owner.getByRole("button", { name: "Mark repeatable" }).click();
  await expect(owner.getByTestId("colourway-status")).toContainText("Repeatable");
  await ownerCtx.close();

  // ---- the recipe card for an 800 g lot, as printed
  await page.getByLabel("Fibre weight of the lot (g)").fill("800");
  await page.getByRole("link", { name: "Open recipe card" }).click();
  const card = page.getByTestId("recipe-card");
  await expect(card).toContainText("800 g");
  // 1.5 % DOS of 800 g = 12 g of dye powder (DOMAIN.md: g of dye = DOS % × fibre g / 100).
  await expect(card.getByRole("row", { name: /Rosehip/ })).toContainText("1.500 %");
  await expect(card.getByRole("row", { name: /Rosehip/ })).toContainText("12.0 g");
  await expect(card).toContainText("safety data sheet");
  await page.emulateMedia({ media: "print" });
  await expect(page.getByRole("navigation", { name: "Studio" })).toBeHidden();
  await page.screenshot({ path: `test-results/screenshots/${info.project.name}-learning-recipe-print.png`, fullPage: true });
  const pdf = await page.pdf({ format: "A4", printBackground: true });
  const pages = (pdf.toString("latin1").match(/\/Type\s*\/Page[^s]/g) ?? []).length;
  expect(pages, "the recipe card prints on one page").toBe(1);
  await page.emulateMedia({ media: "screen" });

  // ---- the same card for a dyer who measures in US kitchen units and °F
  const units = await (await page.request.get("/api/account")).json();
  expect((await page.request.patch("/api/account", { data: { unitSystem: "us", temperatureUnit: "F" } })).ok()).toBe(true);
  try {
    await page.reload();
    await expect(card).toContainText("800 g (28.2 oz)"); // 800 / 28.349523125 g per oz (NIST)
    await expect(card.getByRole("row", { name: /Rosehip/ })).toContainText("12.0 g"); // powder stays in grams
    await expect(card).toContainText(/°F/);
    await expect(card).not.toContainText("°C");
    await shot(page, info, "learning-recipe-us");
  } finally {
    await page.request.patch("/api/account", { data: { unitSystem: units.unitSystem, temperatureUnit: units.temperatureUnit } });
  }
});

test("the studio's dye profiles and the search by colour", async ({ page }, info) => {
  const sid = await studioId(page);
  await page.goto(`/s/${sid}/profiles`);
  // The seed fits four profiles on wool from its twelve calibration dyeings, three per dye.
  const wool = page.locator("section").filter({ has: page.getByRole("heading", { name: "On wool" }) });
  for (const dye of ["Harbour Teal", "Marigold", "Rosehip", "Slate Black"]) {
    await expect(wool.getByRole("listitem").filter({ hasText: dye })).toContainText(/\d+ dyeings · fits well/);
  }
  await shot(page, info, "learning-profiles");
  if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);

  // A teal typed in as L*a*b*: the nearest readings are the Harbour Teal dyeings, nearest first.
  await page.goto(`/s/${sid}/find`);
  await page.getByLabel("L*").fill("54");
  await page.getByLabel("a*").fill("-16");
  await page.getByLabel("b*").fill("-42");
  const readings = page.locator("section").filter({ has: page.getByRole("heading", { name: "Nearest readings" }) });
  await expect(readings.getByRole("link").first()).toContainText("Harbour Teal at 1 %");
  const distances = await readings.getByText(/^ΔE00 /).allInnerTexts();
  const values = distances.map((t) => Number(t.replace("ΔE00 ", "")));
  expect(values.length).toBeGreaterThan(3);
  expect([...values].sort((x, y) => x - y)).toEqual(values);
  await shot(page, info, "learning-find");
  if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);
});
