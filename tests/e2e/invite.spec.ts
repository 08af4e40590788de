// An owner invites a new address; the invitee, new to Undertone, opens the mailed link, signs
// in with an e-mail link and joins with the invited role.
import { randomUUID } from "node:crypto";
import { expect, test } from "@playwright/test";
import { DEMO_STUDIO, account, authFile, expectStudioHome, layoutFaults, linkIn, mailAfter, projectContext, shot } from "./helpers";

test("an invited newcomer joins the studio as a dyer", async ({ browser }, info) => {
  const invitee = `fern-${randomUUID().slice(0, 8)}@newcomer.example`;

  // The owner sends the invitation from the people page.
  const ownerCtx = await browser.newContext({ ...projectContext(info), storageState: authFile("owner") });
  const owner = await ownerCtx.newPage();
  await owner.goto("/");
  await owner.getByRole("link", { name: "People" }).first().click();
  await owner.getByLabel("Their e-mail").fill(invitee);
  await owner.getByLabel("Role", { exact: true }).selectOption("dyer");
  const invitation = await mailAfter(invitee, () => owner.getByRole("button", { name: "Send the invitation" }).click());
  await expect(owner.getByText(`Invitation sent to ${invitee}.`)).toBeVisible();
  await expect(owner.getByRole("heading", { name: "Waiting for an answer" })).toBeVisible();
  await expect(owner.getByRole("listitem").filter({ hasText: invitee })).toContainText("dyer");
  await shot(owner, info, "people-invitation-sent");
  expect(invitation.subject).toBe(`${account("owner").name} invited you to ${DEMO_STUDIO} on Undertone`);

  // The invitee opens the link in their own browser, signed out.
  const guestCtx = await browser.newContext(projectContext(info));
  const page = await guestCtx.newPage();
  await page.goto(linkIn(invitation, "/invite/"));
  await expect(page.getByRole("heading", { name: `Join ${DEMO_STUDIO}` })).toBeVisible();
  await expect(page.getByText(/to join as a dyer/)).toBeVisible();
  await shot(page, info, "invite-signed-out");
  if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);

  const signInMail = await mailAfter(invitee, () => page.getByRole("button", { name: "E-mail me a sign-in link" }).click());
  await expect(page).toHaveURL(/\/signin\/check-mail/);
  await page.goto(linkIn(signInMail, "/api/auth/callback/email"));

  // Back on the invitation, signed in as the invited address.
  await expect(page).toHaveURL(/\/invite\//);
  const join = page.getByRole("button", { name: `Join ${DEMO_STUDIO}` });
  await expect(join).toBeVisible();
  await shot(page, info, "invite-signed-in");
  await join.click();
  const localPart = invitee.split("@")[0];
  await expectStudioHome(page, { name: localPart, role: "dyer" });
  await shot(page, info, "home-newcomer");

  // The owner sees the newcomer as a dyer, and the invitation no longer waits.
  await owner.reload();
  await expect(owner.getByText(invitee)).toHaveCount(1);
  const newcomer = owner.getByRole("listitem").filter({ hasText: invitee });
  await expect(newcomer.getByRole("combobox")).toHaveValue("dyer");

  // The link is spent.
  await page.goto(linkIn(invitation, "/invite/"));
  await expect(page.getByText("already been used")).toBeVisible();

  await ownerCtx.close();
  await guestCtx.close();
});
