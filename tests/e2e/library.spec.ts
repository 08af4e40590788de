// The studio's library at the phone and laptop sizes: the seeded bases, dyes and stock solutions,
// adding a base with fibres that must make 100 %, the stock age warning, sorting and filtering,
// and a guest who reads everything with no write control in sight.
import { type Page, expect, test } from "@playwright/test";
import { authFile, layoutFaults, shot } from "./helpers";

const visible = (page: Page, text: string | RegExp) => page.getByRole("tabpanel").getByText(text).filter({ visible: true });
/** The list's entries as shown: cards on a phone, table rows on a laptop. */
const entries = (page: Page) => page.getByRole("tabpanel").locator("ul > li, tbody > tr").filter({ visible: true });

async function openLibrary(page: Page, tab?: "Dyes" | "Stock solutions") {
  await page.goto("/");
  await page.getByRole("link", { name: "Library" }).filter({ visible: true }).first().click();
  await expect(page.getByRole("heading", { name: "Library", level: 1 })).toBeVisible();
  if (tab) {
    await page.getByRole("tab", { name: tab }).click();
    await expect(page.getByRole("tab", { name: tab })).toHaveAttribute("aria-selected", "true");
  }
  await expect(page.getByRole("tabpanel").getByText(/in all|Showing/)).toBeVisible();
}

test.describe("as the dyer", () => {
  test.use({ storageState: authFile("dyer") });

  test("the bases list shows the seeded bases and what acid dyes leave pale", async ({ page }, info) => {
    await openLibrary(page);
    for (const name of ["Skerry Sock", "Heathland DK", "Moonrise Silk Lace", "Saltmarsh Blend", "Breakwater Aran"]) {
      await expect(visible(page, name)).toBeVisible();
    }
    await expect(visible(page, "The 30 % cotton will stay pale: acid dyes do not dye cellulose.")).toBeVisible();
    await shot(page, info, "library-bases");
    if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);
  });

  test("adding a base: fibres that do not make 100 % are refused with a clear message, then saved", async ({ page }, info) => {
    const name = `Test Tweed ${info.project.name} ${Date.now() % 100000}`;
    await openLibrary(page);
    await page.getByRole("button", { name: "Add a base" }).click();
    const dialog = page.getByRole("dialog", { name: "Add a yarn base" });
    await dialog.getByLabel("Name").fill(name);
    const pct = dialog.getByRole("spinbutton", { name: "%" });
    await pct.first().fill("60");
    await dialog.getByRole("button", { name: "Add a fibre" }).click();
    await dialog.getByRole("combobox", { name: "Fibre 2" }).selectOption("cotton");
    await pct.nth(1).fill("30");
    await expect(dialog.getByText("Total 90 % — must make 100 %")).toBeVisible();
    await expect(dialog.getByText("The 30 % cotton will stay pale")).toBeVisible();
    await dialog.getByRole("button", { name: "Save base" }).click();
    await expect(dialog.getByText("The fibres add up to 90 %; they must make exactly 100 %.")).toBeVisible();
    await shot(page, info, "library-base-form-error");
    await pct.nth(1).fill("40");
    await expect(dialog.getByText("Total 100 % ✓")).toBeVisible();
    await dialog.getByLabel("Weight").selectOption("worsted");
    await dialog.getByLabel("Metres per 100 g").fill("200");
    await dialog.getByRole("button", { name: "Save base" }).click();
    await expect(dialog).toBeHidden();
    await page.getByLabel("Search").fill(name);
    await expect(page.getByRole("tabpanel").getByText("Showing 1 of")).toBeVisible();
    await expect(visible(page, "60 % wool, 40 % cotton")).toBeVisible();
  });

  test("stock solutions: newest first, the old jar flagged, filters narrow the list", async ({ page }, info) => {
    await openLibrary(page, "Stock solutions");
    await expect(visible(page, /97 days old · past 60-day shelf life/)).toBeVisible();
    await expect(page.getByText("One stock solution is past the studio's shelf life")).toBeVisible();
    // The dyer sees the shelf life but may not change it.
    await expect(page.getByText(/get an age warning after/)).toBeVisible();
    await expect(page.getByRole("button", { name: "Change" })).toHaveCount(0);
    await shot(page, info, "library-stocks");
    if (info.project.name === "phone") {
      expect(await layoutFaults(page)).toEqual([]);
      await page.getByRole("button", { name: /^Filters/ }).click();
    }
    await page.getByLabel("Age").selectOption("true");
    await expect(page.getByRole("tabpanel").getByText(/^Showing 1 of/)).toBeVisible();
    await expect(entries(page)).toHaveCount(1);
    await expect(entries(page)).toContainText("Slate Black");
  });

  test("sorting by name Z–A puts the last name first", async ({ page }, info) => {
    await openLibrary(page, "Dyes");
    if (info.project.name === "phone") {
      await page.getByLabel("Sort").selectOption({ label: "Name: Z–A" });
      await expect(entries(page).first()).toContainText("Slate Black");
    } else {
      await page.getByRole("columnheader", { name: "Name" }).getByRole("button").click();
      await expect(page.getByRole("columnheader", { name: "Name" })).toHaveAttribute("aria-sort", "descending");
      await expect(entries(page).first()).toContainText("Slate Black");
    }
    await shot(page, info, "library-dyes");
  });
});

test.describe("as the guest", () => {
  test.use({ storageState: authFile("guest") });

  test("reads every library with no write control, and the safety sheet opens in a new tab", async ({ page }, info) => {
    await openLibrary(page, "Dyes");
    await expect(visible(page, "Harbour Teal")).toBeVisible();
    const sds = page.getByRole("link", { name: "Safety data sheet for Harbour Teal (opens in a new tab)" }).filter({ visible: true });
    await expect(sds).toHaveAttribute("href", /^https:\/\//);
    await expect(sds).toHaveAttribute("target", "_blank");
    for (const tab of ["Bases", "Dyes", "Stock solutions"] as const) {
      await page.getByRole("tab", { name: tab }).click();
      await expect(page.getByRole("tab", { name: tab })).toHaveAttribute("aria-selected", "true");
      await expect(page.getByRole("tabpanel").getByText(/in all/)).toBeVisible();
      await expect(page.getByRole("button", { name: /^Add a/ })).toHaveCount(0);
      await expect(page.getByRole("button", { name: /^Edit/ })).toHaveCount(0);
    }
    await shot(page, info, "library-guest-stocks");
  });
});
