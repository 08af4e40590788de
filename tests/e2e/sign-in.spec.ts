// Signing in as each demo role, with a password and with a one-time link from the mail fake.
import { expect, test } from "@playwright/test";
import { account, demoAccounts, expectStudioHome, layoutFaults, linkIn, mailAfter, projectContext, shot, signInWithPassword } from "./helpers";

test("signed out, the studio sends you to sign in", async ({ page }, info) => {
  await page.goto("/");
  await expect(page).toHaveURL(/\/signin$/);
  await expect(page.getByRole("heading", { name: "Sign in to your studio" })).toBeVisible();
  await shot(page, info, "signin");
  if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);
});

for (const a of demoAccounts) {
  test(`the ${a.role} signs in with a password and sees the studio`, async ({ page }, info) => {
    await signInWithPassword(page, a);
    await expectStudioHome(page, a);
    // Three demo members, plus any newcomer an earlier invitation test let in.
    await expect(page.getByText(/^\d+ people$/)).toBeVisible();
    await shot(page, info, `home-${a.role}`);
    if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);
  });

  test(`the ${a.role} signs in with an e-mail link`, async ({ page }, info) => {
    await page.goto("/signin");
    await page.getByRole("tab", { name: "E-mail me a link" }).click();
    await page.getByLabel("E-mail").fill(a.email);
    const mail = await mailAfter(a.email, () => page.getByRole("button", { name: "Send the link" }).click());
    await expect(page).toHaveURL(/\/signin\/check-mail/);
    await expect(page.getByText(a.email)).toBeVisible();
    if (a.role === "owner") {
      await shot(page, info, "check-mail");
      if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);
    }
    expect(mail.subject).toBe("Your Undertone sign-in link");
    await page.goto(linkIn(mail, "/api/auth/callback/email"));
    await expectStudioHome(page, a);
  });
}

test("a wrong password keeps you on the sign-in page with a message", async ({ page }, info) => {
  await signInWithPassword(page, { email: account("dyer").email, password: "not-the-password" });
  await expect(page.getByRole("alert").filter({ hasText: "do not match" })).toBeVisible();
  await expect(page).toHaveURL(/\/signin/);
  await shot(page, info, "signin-wrong-password");
});

test("a sign-in link works only once", async ({ page, browser }, info) => {
  const a = account("guest");
  await page.goto("/signin");
  await page.getByRole("tab", { name: "E-mail me a link" }).click();
  await page.getByLabel("E-mail").fill(a.email);
  const mail = await mailAfter(a.email, () => page.getByRole("button", { name: "Send the link" }).click());
  const link = linkIn(mail, "/api/auth/callback/email");
  await page.goto(link);
  await expectStudioHome(page, a);
  // The second visit from a browser with no cookies at all. (Clearing this page's cookies races
  // with its own session refresh still in flight, which sets the session cookie again.)
  const other = await browser.newContext(projectContext(info));
  const again = await other.newPage();
  await again.goto(link);
  await expect(again).toHaveURL(/\/signin\?error=Verification/);
  await expect(again.getByRole("alert").filter({ hasText: "expired or was used already" })).toBeVisible();
  await other.close();
});

test("a crafted next address cannot send you off the site after sign-in", async ({ page }) => {
  const a = account("dyer");
  // Browsers read "/\host" as "//host", another site.
  await page.goto(`/signin?next=${encodeURIComponent("/\\elsewhere.invalid/page")}`);
  await page.getByLabel("E-mail").fill(a.email);
  await page.getByLabel("Password").fill(a.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expectStudioHome(page, a);
});

test("the next address brings you back where you were going", async ({ page }) => {
  const a = account("guest");
  await page.goto("/account");
  await expect(page).toHaveURL(/\/signin\?next=%2Faccount$/);
  await page.getByLabel("E-mail").fill(a.email);
  await page.getByLabel("Password").fill(a.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(/\/account$/);
  await expect(page.getByRole("heading", { name: a.name })).toBeVisible();
});
