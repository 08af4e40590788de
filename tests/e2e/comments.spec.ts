// Studio-mates talking about a trial: the dyer comments with a mention of the guest designer;
// the guest gets the mail in the SMTP fake, follows its link, signs in and replies; the dyer then
// finds both comments in the activity feed and the reply in their notifications.
import { createHmac, randomUUID } from "node:crypto";
import { type APIRequestContext, type Page, expect, test } from "@playwright/test";
import { account, authFile, layoutFaults, linkIn, mailAfter, projectContext, shot } from "./helpers";

// The same secret the Playwright web server runs with (playwright.config.ts).
const SECRET = process.env.NEXTAUTH_SECRET ?? "undertone-test-secret-not-for-use";
// lib/outbox.ts flushKey(): the flush route's bearer key in production is an HMAC of the secret.
const FLUSH_KEY = createHmac("sha256", SECRET).update("undertone-outbox-flush").digest("hex");
const TRIAL = "Moss: teal and marigold together";

/** Sends every queued mail now instead of waiting out the batch window. */
async function flushMail(request: APIRequestContext) {
  const res = await request.post("/api/internal/outbox/flush?all=1", { headers: { authorization: `Bearer ${FLUSH_KEY}` } });
  expect(res.status(), await res.text()).toBe(200);
}

async function trialUrl(page: Page): Promise<string> {
  await page.goto("/");
  await expect(page).toHaveURL(/\/s\/[0-9a-f-]{36}$/);
  const sid = page.url().match(/\/s\/([0-9a-f-]{36})/)![1];
  const res = await page.request.get(`/api/studios/${sid}/trials?q=${encodeURIComponent("teal and marigold")}`);
  const list = (await res.json()) as { items: { id: string; title: string }[] };
  const trial = list.items.find((t) => t.title === TRIAL);
  expect(trial, `the demo trial “${TRIAL}”`).toBeTruthy();
  return `/s/${sid}/trials/${trial!.id}`;
}

test("a mention reaches the guest by mail; the guest replies; the dyer sees both", async ({ browser }, info) => {
  test.setTimeout(180_000);
  const dyer = account("dyer");
  const guest = account("guest");
  const mark = randomUUID().slice(0, 6);

  // The dyer writes on the owner's trial and mentions the guest designer.
  const dyerCtx = await browser.newContext({ ...projectContext(info), storageState: authFile("dyer") });
  const page = await dyerCtx.newPage();
  const url = await trialUrl(page);
  await page.goto(url);
  const editor = page.getByRole("textbox", { name: "Write a comment" });
  await editor.scrollIntoViewIfNeeded();
  await editor.click();
  await editor.pressSequentially(`Would this break read well in a shawl (${mark})? Asking @Sun`);
  await page.getByRole("option", { name: /Sunniva Okafor/ }).click();
  await editor.pressSequentially(" what do you think?");
  await shot(page, info, "comment-writing");

  const mail = await mailAfter(guest.email, async () => {
    await page.getByRole("button", { name: "Post comment" }).click();
    await expect(page.getByRole("listitem", { name: `Comment by ${dyer.name}` }).filter({ hasText: mark })).toBeVisible();
    await flushMail(page.request);
  });
  const posted = page.getByRole("listitem", { name: `Comment by ${dyer.name}` }).filter({ hasText: mark });
  await expect(posted.locator(".mention")).toHaveText(`@${guest.name}`);
  await expect(editor).toHaveText("");
  await expect(page.getByRole("button", { name: "Following" })).toBeVisible();
  await shot(page, info, "comment-posted");

  expect(mail.subject).toBe(`${dyer.name} mentioned you on “${TRIAL}”`);
  expect(mail.text).toContain(mark);
  expect(mail.text).toMatch(/Stop these mails: http/);

  // The guest, signed out, opens the mailed link, signs in and lands on the trial.
  const guestCtx = await browser.newContext(projectContext(info));
  const g = await guestCtx.newPage();
  await g.goto(linkIn(mail, "/trials/"));
  await expect(g).toHaveURL(/\/signin\?next=/);
  // Sign in right there (not from a fresh /signin), so the page returns to the trial.
  await g.getByLabel("E-mail").fill(guest.email);
  await g.getByLabel("Password").fill(guest.password);
  await g.getByRole("button", { name: "Sign in" }).click();
  await expect(g).toHaveURL(new RegExp(`${url}(#.*)?$`), { timeout: 30_000 });
  const original = g.getByRole("listitem", { name: `Comment by ${dyer.name}` }).filter({ hasText: mark });
  await expect(original).toBeVisible();
  // A guest may comment, but has no remove button on the dyer's words.
  await expect(original.getByRole("button", { name: "Remove" })).toHaveCount(0);
  await original.getByRole("button", { name: "Reply" }).click();
  const reply = g.getByRole("textbox", { name: "Write a comment" });
  await expect(reply.locator(".mention")).toHaveText(`@${dyer.name}`);
  await reply.pressSequentially(`yes, it would suit a crescent shawl ${mark}-reply`);
  await g.getByRole("button", { name: "Post comment" }).click();
  const answer = g.getByRole("listitem", { name: `Comment by ${guest.name}` }).filter({ hasText: `${mark}-reply` });
  await expect(answer).toBeVisible();
  await shot(g, info, "comment-guest-reply");
  if (info.project.name === "phone") expect(await layoutFaults(g)).toEqual([]);

  // The dyer: the reply is in their notifications and both comments are in the activity feed.
  await page.goto(url.replace(/\/trials\/.*/, "/activity"));
  await expect(page.getByRole("heading", { name: "Activity", level: 1 })).toBeVisible();
  const forYou = page.getByRole("list", { name: "Notifications" });
  await expect(forYou.getByRole("link", { name: new RegExp(`${guest.name} mentioned you on “${TRIAL}”`) }).first()).toBeVisible();
  const feed = page.getByRole("list", { name: "Activity" });
  await expect(feed.getByRole("listitem").filter({ hasText: `${mark}-reply` })).toContainText(`${guest.name} commented on “${TRIAL}”`);
  await expect(feed.getByRole("listitem").filter({ hasText: `(${mark})` })).toContainText(`${dyer.name} commented on “${TRIAL}”`);
  await expect(page.getByRole("banner").getByRole("link", { name: /Notifications, \d+ unread/ })).toBeVisible();
  await shot(page, info, "activity-dyer");
  if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);

  // Filtering by person keeps only the guest's line for this mark.
  await page.getByLabel("Who").selectOption({ label: guest.name });
  await expect(feed.getByRole("listitem").filter({ hasText: `(${mark})` })).toHaveCount(0);
  await expect(feed.getByRole("listitem").filter({ hasText: `${mark}-reply` })).toHaveCount(1);

  // Opening the notification reads it and leads to the reply on the trial.
  await forYou.getByRole("link", { name: new RegExp(`${guest.name} mentioned you`) }).first().click();
  await expect(page).toHaveURL(/\/trials\/.*#comment-/);
  await expect(page.getByRole("listitem", { name: `Comment by ${guest.name}` }).filter({ hasText: `${mark}-reply` })).toBeVisible();

  await dyerCtx.close();
  await guestCtx.close();
});
