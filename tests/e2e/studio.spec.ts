// The studio pages each role sees once signed in: home, people, studios and account.
import { expect, test } from "@playwright/test";
import { DEMO_STUDIO, type Role, account, authFile, layoutFaults, shot } from "./helpers";

const roles: Role[] = ["owner", "dyer", "guest"];

for (const role of roles) {
  test.describe(`as the ${role}`, () => {
    test.use({ storageState: authFile(role) });

    test("the people page lists the studio; only the owner manages it", async ({ page }, info) => {
      await page.goto("/");
      await page.getByRole("link", { name: "People" }).first().click();
      await expect(page.getByRole("heading", { name: "People", level: 1 })).toBeVisible();
      for (const r of roles) await expect(page.getByText(account(r).email)).toBeVisible();
      const invite = page.getByRole("heading", { name: "Invite someone" });
      const remove = page.getByRole("button", { name: /^Remove / });
      if (role === "owner") {
        await expect(invite).toBeVisible();
        // One per member: the three demo people and any newcomer an invitation test let in.
        await expect(remove.first()).toBeVisible();
        expect(await remove.count()).toBeGreaterThanOrEqual(3);
        expect(await remove.count()).toBe(await page.getByRole("combobox", { name: /^Role of / }).count());
        await expect(page.getByLabel(`Role of ${account("dyer").name}`)).toHaveValue("dyer");
      } else {
        await expect(invite).toHaveCount(0);
        await expect(remove).toHaveCount(0);
      }
      await shot(page, info, `people-${role}`);
      if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);
    });
  });
}

test.describe("as the dyer, outside the studio pages", () => {
  test.use({ storageState: authFile("dyer") });

  test("the studio chooser lists the demo studio with the dyer's role", async ({ page }, info) => {
    await page.goto("/studios");
    const row = page.getByRole("link", { name: new RegExp(DEMO_STUDIO) });
    await expect(row).toContainText("Dyer");
    await shot(page, info, "studios");
    if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);
    await row.click();
    await expect(page).toHaveURL(/\/s\/[0-9a-f-]{36}$/);
  });

  test("the account page shows the person and their unit choices", async ({ page }, info) => {
    await page.goto("/account");
    await expect(page.getByRole("heading", { name: account("dyer").name })).toBeVisible();
    await expect(page.getByText(account("dyer").email)).toBeVisible();
    await expect(page.getByRole("radio", { name: "Metric (g, ml)" })).toBeChecked();
    await shot(page, info, "account");
    if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);
  });

  test("a studio the dyer does not belong to is not found", async ({ page }) => {
    const res = await page.goto("/s/00000000-0000-4000-8000-000000000000");
    expect(res?.status()).toBe(404);
  });
});
