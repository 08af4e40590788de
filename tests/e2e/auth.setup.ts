// Signs each demo role in once with their password and keeps the browser state for the specs.
import { test as setup } from "@playwright/test";
import { authFile, demoAccounts, expectStudioHome, signInWithPassword } from "./helpers";

for (const a of demoAccounts) {
  setup(`sign in as the ${a.role}`, async ({ page }) => {
    await signInWithPassword(page, a);
    await expectStudioHome(page, a);
    await page.context().storageState({ path: authFile(a.role) });
  });
}
