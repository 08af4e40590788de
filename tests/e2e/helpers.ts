// Shared steps and checks for the browser tests: demo accounts, signing in, mail, screenshots
// and layout checks for a phone held at the dye table.
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { type BrowserContextOptions, type Page, type TestInfo, expect } from "@playwright/test";
import { type FakeMessage, linksIn, listMessages, waitForMessage } from "../support/mail";

export type Role = "owner" | "dyer" | "guest";
export interface DemoAccount {
  email: string;
  name: string;
  password: string;
  role: Role;
}

const root = fileURLToPath(new URL("../..", import.meta.url));
export const demoAccounts: DemoAccount[] = JSON.parse(readFileSync(`${root}scripts/demo-accounts.json`, "utf8"));
export const account = (role: Role) => demoAccounts.find((a) => a.role === role)!;
export const DEMO_STUDIO = "Tidewrack Yarn Studio";

/** Where the setup project keeps each role's signed-in browser state. */
export const authFile = (role: Role) => `${root}test-results/.auth/${role}.json`;

/** What each role reads under the greeting on the studio home (components/studio/studio-home.tsx). */
export const ROLE_LINE: Record<Role, RegExp> = {
  owner: /You run this studio/,
  dyer: /You log trials, photograph swatches/,
  guest: /You can read the trials and colourways you are shown/,
};

/** The context settings of the running project (viewport, touch…), for extra contexts. */
export function projectContext(info: TestInfo): BrowserContextOptions {
  const u = info.project.use;
  return {
    baseURL: u.baseURL,
    viewport: u.viewport,
    deviceScaleFactor: u.deviceScaleFactor,
    isMobile: u.isMobile,
    hasTouch: u.hasTouch,
    userAgent: u.userAgent,
    locale: u.locale,
    timezoneId: u.timezoneId,
  };
}

export async function signInWithPassword(page: Page, a: { email: string; password: string }) {
  await page.goto("/signin");
  await page.getByLabel("E-mail").fill(a.email);
  await page.getByLabel("Password").fill(a.password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

/** Waits for the studio home of the demo studio and checks it greets `a` in their role. */
export async function expectStudioHome(page: Page, a: { name: string; role: Role }) {
  await expect(page).toHaveURL(/\/s\/[0-9a-f-]{36}$/);
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(`Hello, ${a.name.split(" ")[0]}`);
  await expect(page.getByText(ROLE_LINE[a.role])).toBeVisible();
  await expect(page.getByRole("banner").getByRole("link", { name: DEMO_STUDIO })).toBeVisible();
}

/** Runs `action` and returns the first message to `to` that arrives after it started. */
export async function mailAfter(to: string, action: () => Promise<unknown>): Promise<FakeMessage> {
  const before = new Set((await listMessages(to)).map((m) => m.id));
  await action();
  return waitForMessage(to, { match: (m) => !before.has(m.id), timeoutMs: 15_000 });
}

/** The one link in a message whose path contains `part`. */
export function linkIn(m: FakeMessage, part: string): string {
  const found = linksIn(m).filter((l) => l.includes(part));
  expect(found, `links with ${part} in "${m.subject}"`).toHaveLength(1);
  return found[0];
}

/**
 * Screenshots under test-results/screenshots/, named after the project. Desktop: the full page.
 * Phone: what the screen shows (a full-page shot would paint the fixed bottom bar mid-page),
 * and, when the page scrolls, the screen scrolled to the end as well.
 */
export async function shot(page: Page, info: TestInfo, name: string) {
  await page.evaluate(() => document.fonts.ready);
  const path = (suffix = "") => `${root}test-results/screenshots/${info.project.name}-${name}${suffix}.png`;
  if (info.project.name !== "phone") {
    await page.screenshot({ path: path(), fullPage: true });
    return;
  }
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.screenshot({ path: path() });
  const scrolls = await page.evaluate(() => document.documentElement.scrollHeight > window.innerHeight + 1);
  if (scrolls) {
    await page.evaluate(() => window.scrollTo(0, document.documentElement.scrollHeight));
    await page.screenshot({ path: path("-end") });
    await page.evaluate(() => window.scrollTo(0, 0));
  }
}

/**
 * Layout faults a phone user would meet: controls smaller than 44 × 44 px (PRODUCT.md), a page
 * wider than the screen, and the bottom bar covering the end of the content.
 */
export async function layoutFaults(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const faults: string[] = [];
    const sel = "a[href], button, input:not([type=hidden]), select, textarea, [role=tab]";
    for (const el of Array.from(document.querySelectorAll<HTMLElement>(sel))) {
      if (el.classList.contains("sr-only")) continue; // its label is the target
      const r = el.getBoundingClientRect();
      if (r.width === 0 || r.height === 0 || getComputedStyle(el).visibility === "hidden") continue;
      if (r.width < 44 || r.height < 44) {
        const name = (el.getAttribute("aria-label") ?? el.textContent ?? "").trim().slice(0, 40);
        faults.push(`small target: ${el.tagName.toLowerCase()} "${name}" ${Math.round(r.width)}×${Math.round(r.height)}`);
      }
    }
    if (document.documentElement.scrollWidth > window.innerWidth + 1) {
      faults.push(`page ${document.documentElement.scrollWidth} px wide on a ${window.innerWidth} px screen`);
    }
    const nav = document.querySelector<HTMLElement>("nav[aria-label=Studio]");
    const main = document.querySelector<HTMLElement>("main");
    if (nav && main && getComputedStyle(nav).position === "fixed") {
      window.scrollTo(0, document.documentElement.scrollHeight);
      const last = main.lastElementChild?.getBoundingClientRect();
      const navTop = nav.getBoundingClientRect().top;
      if (last && last.bottom > navTop) faults.push(`bottom bar covers the content by ${Math.round(last.bottom - navTop)} px`);
      window.scrollTo(0, 0);
    }
    return faults;
  });
}
