// A dye session on a phone: start a trial on a base, add a dip-gradient layer and a dry-applied
// over-dye with amounts in kitchen measures, run a steam timer to the end (page clock mocked),
// keep editing while the connection is down, and find every edit on the server afterwards.
// A guest reads the same page without a single write control.
import { type Locator, type Page, expect, request as apiRequest, test } from "@playwright/test";
import { authFile, layoutFaults, shot } from "./helpers";

// Exact US customary measures (NIST Handbook 44, Appendix C): 1 tsp = 4.92892159375 ml,
// 1 tbsp = 14.78676478125 ml. Stock arithmetic from DOMAIN.md: g of dye = ml × stock % / 100
// for a "made up to volume" stock; DOS % = g of dye / g of fibre × 100.
const TSP_ML = 4.92892159375;
const TBSP_ML = 14.78676478125;

interface Counter {
  taps: number;
}

/** A tap the dyer makes (a click, or focusing a field to type in it), counted. */
function tapper(c: Counter) {
  return {
    tap: async (l: Locator) => {
      c.taps++;
      await l.click();
    },
    type: async (l: Locator, text: string) => {
      c.taps++;
      await l.fill(text);
    },
  };
}

async function studioId(page: Page): Promise<string> {
  await page.goto("/");
  await expect(page).toHaveURL(/\/s\/[0-9a-f-]{36}$/);
  return page.url().match(/\/s\/([0-9a-f-]{36})/)![1];
}

test.describe("as the dyer", () => {
  test.use({ storageState: authFile("dyer") });

  test("logs a layered trial with a timer and offline edits, and the server has all of it", async ({ page, context }, info) => {
    test.setTimeout(240_000);
    await context.grantPermissions(["notifications"]);
    // Record what the timer's alarm asks of the phone.
    await page.addInitScript(() => {
      const w = window as unknown as { __vibrations: unknown[]; __notes: string[] };
      w.__vibrations = [];
      w.__notes = [];
      navigator.vibrate = ((p: VibratePattern) => (w.__vibrations.push(p), true)) as Navigator["vibrate"];
      const Real = window.Notification;
      class Spy extends Real {
        constructor(title: string, opts?: NotificationOptions) {
          w.__notes.push(title);
          super(title, opts);
        }
      }
      Object.defineProperty(window, "Notification", { value: Spy });
    });
    await page.clock.install();
    const sid = await studioId(page);
    // A timer left running by an earlier attempt of this test (Playwright retries once) would ring
    // here too: stop any the studio still has, so this attempt hears its own alarm only.
    const left = (await (await page.request.get(`/api/studios/${sid}/timers`)).json()) as { items: { id: string; version: number }[] };
    for (const t of left.items) {
      expect((await page.request.patch(`/api/studios/${sid}/timers/${t.id}`, { data: { action: "cancel", version: t.version } })).ok()).toBe(true);
    }
    const prefs = await page.request.get("/api/account");
    const before = await prefs.json();
    // Kitchen measures on screen for this session; the dyer's own choice comes back at the end.
    expect((await page.request.patch("/api/account", { data: { unitSystem: "us", temperatureUnit: "F" } })).ok()).toBe(true);
    try {
      // ---- start a trial on a base, choosing the first layer's method on the same screen
      const title = `Teal dip with rosehip rub ${Date.now().toString(36)}`;
      await page.goto(`/s/${sid}/trials/new`);
      await page.getByLabel("What are you trying?").fill(title);
      await page.getByRole("radio", { name: "Skerry Sock" }).click();
      await expect(page.getByLabel("Weighed dry fibre (g)")).toHaveValue("100");
      await page.getByRole("radio", { name: "Dip / gradient" }).click();
      await shot(page, info, "trial-new");
      if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);
      await page.getByRole("button", { name: "Start and add the first layer" }).click();

      // ---- layer 1: a dip gradient, Harbour Teal from its 1 % stock, 1 1/2 teaspoons
      await expect(page.getByRole("heading", { name: "Dyes and amounts" })).toBeVisible();
      await page.getByRole("button", { name: "Harbour Teal" }).click();
      await expect(page.getByRole("radio", { name: /1 % stock/ })).toHaveAttribute("aria-checked", "true");
      await expect(page.getByRole("radio", { name: "tsp" })).toHaveAttribute("aria-checked", "true");
      await page.getByLabel("How much (tsp)").fill("1 1/2");
      // 1.5 tsp = 7.39 ml of 1 % stock = 0.0739 g of dye = 0.0739 % on 100 g.
      const g1 = (1.5 * TSP_ML * 1) / 100;
      const dos1 = (g1 / 100) * 100;
      expect(dos1.toPrecision(3)).toBe("0.0739");
      await expect(page.getByText("= 0.0739 % DOS · 0.0739 g dye · 7.4 ml of 1 % stock · 1 1/2 tsp")).toBeVisible();
      await shot(page, info, "wizard-dyes");
      await page.getByRole("button", { name: "Add Harbour Teal" }).click();
      await page.getByRole("button", { name: "Next: acid and heat" }).click();
      // Dip defaults: a bath at 1:30 (3 l for 100 g), 85 °C shown as 185 °F, vinegar at 2 % owf (40 ml).
      await expect(page.getByLabel("Water")).toHaveValue("3");
      await expect(page.getByText("Liquor ratio 1:30")).toBeVisible();
      await expect(page.getByLabel("Temperature")).toHaveValue("185");
      await expect(page.getByLabel("Vinegar")).toHaveValue("40");
      await shot(page, info, "wizard-heat");
      await page.getByRole("button", { name: "Next: gradient" }).click();
      await page.getByRole("button", { name: "More sections" }).click();
      await expect(page.getByText("5 sections")).toBeVisible();
      await shot(page, info, "wizard-gradient");
      await page.getByRole("button", { name: "Save layer" }).click();

      await expect(page.getByRole("heading", { name: title })).toBeVisible();
      const layer1 = page.getByRole("article").filter({ has: page.getByRole("heading", { name: /1\. Dip \/ gradient/ }) });
      await expect(layer1.getByText("1 1/2 tsp", { exact: true })).toBeVisible();
      await expect(layer1.getByText("0.0739 % DOS · 0.0739 g dye · 7.4 ml of 1 % stock · 1 1/2 tsp")).toBeVisible();
      await expect(layer1.getByRole("img", { name: /Gradient in 5 sections/ })).toBeVisible();
      await expect(layer1.getByText("185 °F for 30 min")).toBeVisible();

      // ---- layer 2: a dry-applied over-dye, Rosehip from its 1 % stock, one tablespoon (taps counted)
      const count: Counter = { taps: 0 };
      const { tap, type } = tapper(count);
      await tap(page.getByRole("link", { name: "+ Add a layer" }));
      await tap(page.getByRole("radio", { name: /Dry application/ }));
      await tap(page.getByRole("button", { name: "Rosehip" }));
      await tap(page.getByRole("radio", { name: "tbsp" }));
      await type(page.getByLabel("How much (tbsp)"), "1");
      await tap(page.getByRole("button", { name: "Add Rosehip" }));
      await tap(page.getByRole("button", { name: "Next: acid and heat" }));
      // A dry application is set by steaming: 20 minutes unless the dyer says otherwise.
      await expect(page.getByRole("radio", { name: "Steam" })).toHaveAttribute("aria-checked", "true");
      await expect(page.getByLabel("Setting time")).toHaveValue("20");
      await tap(page.getByRole("button", { name: "Next: coverage" }));
      await tap(page.getByRole("radio", { name: "25 %" }));
      await shot(page, info, "wizard-coverage");
      await tap(page.getByRole("button", { name: "Save layer" }));
      const layer2 = page.getByRole("article").filter({ has: page.getByRole("heading", { name: /2\. Dry application/ }) });
      await expect(layer2.getByText("1 tbsp", { exact: true })).toBeVisible();
      // 1 tbsp = 14.79 ml of 1 % stock = 0.148 g of dye = 0.148 % on 100 g.
      await expect(layer2.getByText("0.148 % DOS · 0.148 g dye · 14.8 ml of 1 % stock · 1 tbsp")).toBeVisible();
      await expect(layer2.getByText(/about 25 % of the fibre/)).toBeVisible();
      info.annotations.push({ type: "taps to log one layer", description: String(count.taps) });
      console.log(`[${info.project.name}] taps to log the dry-application layer: ${count.taps}`);
      expect(count.taps).toBeLessThanOrEqual(12);
      // Powder and steam cautions appear on the layer where they first matter, acid and disposal
      // on the first layer only, each with the reminder that the safety sheet comes first.
      const safety2 = layer2.getByRole("note", { name: "Safety" });
      await expect(safety2).toContainText("Dye powder:");
      await expect(safety2).toContainText("Steaming:");
      await expect(safety2).not.toContainText("Acid bath:");
      await expect(safety2).toContainText("safety data sheet");
      await expect(layer1.getByRole("note", { name: "Safety" })).toContainText("Acid bath:");
      await shot(page, info, "trial-two-layers");
      if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);

      // Both layers reach the server (the page showed them while they were on their way).
      await expect(page.getByText(/Waiting to send/)).toHaveCount(0, { timeout: 60_000 });
      // The server converted both kitchen measures with the same arithmetic.
      const trialId = page.url().match(/trials\/([0-9a-f-]{36})/)![1];
      const saved = await (await page.request.get(`/api/studios/${sid}/trials/${trialId}`)).json();
      expect(saved.layers.map((l: { method: string }) => l.method)).toEqual(["dip", "dry"]);
      expect(saved.layers[0].dyes[0].dosPct).toBeCloseTo(dos1, 6);
      expect(saved.layers[1].dyes[0].dosPct).toBeCloseTo(TBSP_ML / 100, 6);
      expect(saved.layers[1].dyes[0].entered).toEqual({ value: 1, unit: "tbsp" });
      expect(saved.layers[0].gradient.sections).toBe(5);
      expect(saved.layers[1].coverage).toBe(0.25);

      // ---- a 20-minute steam, run to the end on the page's clock, then finished
      await layer2.getByRole("button", { name: /Steam 20 min/ }).click();
      const bar = page.getByRole("region", { name: "Step timers" });
      const row = bar.getByRole("listitem").filter({ hasText: title });
      await expect(row.getByRole("timer", { name: /Steam: (20:00|19:5\d) left/ })).toBeVisible();
      await page.clock.fastForward("20:01");
      await expect(row.getByRole("timer", { name: "Steam: time is up" })).toBeVisible();
      await shot(page, info, "timer-due");
      const alarm = await page.evaluate(() => {
        const w = window as unknown as { __vibrations: unknown[]; __notes: string[] };
        return { vibrations: w.__vibrations.length, notes: w.__notes };
      });
      expect(alarm.vibrations).toBe(1);
      expect(alarm.notes).toEqual(["Steam: time is up"]);
      await row.getByRole("button", { name: "Finish Steam" }).click();
      await expect(bar).toHaveCount(0);
      const timers = await (await page.request.get(`/api/studios/${sid}/timers?trialId=${trialId}`)).json();
      expect(timers.items[0]).toMatchObject({ label: "Steam", state: "done", durationSec: 1200, layerId: saved.layers[1].id });

      // ---- the Wi-Fi drops: three edits are kept on the phone and listed as waiting
      await context.setOffline(true);
      await expect(page.getByText("Offline — your changes are kept on this device")).toBeVisible();
      await layer1.getByRole("button", { name: "Write what you see" }).click();
      await page.getByLabel("What you see").fill("Teal broke to green at the tips");
      await page.getByRole("button", { name: "Keep note" }).click();
      await layer2.getByRole("button", { name: "Write what you see" }).click();
      await page.getByLabel("What you see").fill("Rosehip patches stayed where rubbed");
      await page.getByRole("button", { name: "Keep note" }).click();
      await page.getByRole("radio", { name: "Done" }).click();
      await expect(page.getByText("Waiting to send: 3")).toBeVisible();
      await expect(layer1.getByText("Teal broke to green at the tips")).toBeVisible();
      await page.getByRole("button", { name: /Waiting to send/ }).click();
      await expect(page.getByText(`${title}: layer 2 observations`)).toBeVisible();
      await shot(page, info, "offline-waiting");
      const whileOffline = await page.evaluate(() => localStorage.getItem("undertone.cache") ?? "");
      expect(whileOffline).toContain("Rosehip patches stayed where rubbed");

      // ---- back online: everything is sent, in order, and the server has each edit
      await context.setOffline(false);
      await expect(page.getByText(/Waiting to send/)).toHaveCount(0, { timeout: 20_000 });
      const after = await (await page.request.get(`/api/studios/${sid}/trials/${trialId}`)).json();
      expect(after.status).toBe("done");
      expect(after.layers[0].observations).toBe("Teal broke to green at the tips");
      expect(after.layers[1].observations).toBe("Rosehip patches stayed where rubbed");
      expect(after.layers[1].dyes[0].entered).toEqual({ value: 1, unit: "tbsp" });
      await shot(page, info, "trial-synced");

      // ---- a clash: offline, the dyer rewrites layer 1's note while the owner saves another
      await context.setOffline(true);
      await layer1.getByRole("button", { name: "Change what you saw" }).click();
      await page.getByLabel("What you see").fill("Green tips, teal body, no white left");
      await page.getByRole("button", { name: "Keep note" }).click();
      const owner = await apiRequest.newContext({ baseURL: info.project.use.baseURL, storageState: authFile("owner") });
      const current = await (await owner.get(`/api/studios/${sid}/trials/${trialId}`)).json();
      const ownerSave = await owner.patch(`/api/studios/${sid}/trials/${trialId}/layers/${current.layers[0].id}`, {
        data: { version: current.layers[0].version, observations: "Owner: tips look more yellow than green" },
      });
      expect(ownerSave.ok()).toBe(true);
      await context.setOffline(false);
      // Refused with 409, and the dyer's words stay on screen to apply again, not dropped.
      const clash = page.getByRole("region", { name: "A change that was not saved" });
      await expect(clash).toContainText("someone else changed this first");
      await expect(clash).toContainText("Green tips, teal body, no white left");
      await shot(page, info, "conflict");
      let onServer = await (await owner.get(`/api/studios/${sid}/trials/${trialId}`)).json();
      expect(onServer.layers[0].observations).toBe("Owner: tips look more yellow than green");
      await clash.getByRole("button", { name: "Apply my values again" }).click();
      await expect(clash).toHaveCount(0);
      await expect(page.getByText(/Waiting to send/)).toHaveCount(0, { timeout: 60_000 });
      onServer = await (await owner.get(`/api/studios/${sid}/trials/${trialId}`)).json();
      expect(onServer.layers[0].observations).toBe("Green tips, teal body, no white left");
      await owner.dispose();
    } finally {
      await page.request.patch("/api/account", { data: { unitSystem: before.unitSystem, temperatureUnit: before.temperatureUnit } });
    }
  });
});

test.describe("as the guest", () => {
  test.use({ storageState: authFile("guest") });

  test("reads a trial with no write control anywhere on it", async ({ page }, info) => {
    const sid = await studioId(page);
    const list = await (await page.request.get(`/api/studios/${sid}/trials?q=Violet gradient over teal`)).json();
    expect(list.items.length).toBeGreaterThan(0);
    await page.goto(`/s/${sid}/trials/${list.items[0].id}`);
    await expect(page.getByRole("heading", { name: "Violet gradient over teal" })).toBeVisible();
    await expect(page.getByRole("article").first()).toBeVisible();
    for (const name of [/Add a layer/, /^Edit/, /Write what you see/, /Change what you saw/, /Duplicate/, /Delete/, /Steam \d+ min/, /Other timer/, /Same recipe/]) {
      await expect(page.getByRole("button", { name }).or(page.getByRole("link", { name }))).toHaveCount(0);
    }
    await expect(page.getByRole("radiogroup", { name: "Status" })).toHaveCount(0);
    await expect(page.getByRole("button", { name: /^Move layer/ })).toHaveCount(0);
    await expect(page.getByRole("toolbar", { name: "Text style" })).toHaveCount(0);
    // The notes read as text; (guests may still write comments: that thread is theirs to use).
    await expect(page.getByRole("textbox", { name: "Trial notes" })).toHaveAttribute("contenteditable", "false");
    await shot(page, info, "trial-guest");
    if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);
  });
});
