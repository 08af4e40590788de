// Security of what the browser gets: the headers of pages, API answers and static files; a
// Content-Security-Policy the app really works under (pages hydrate, a photo goes to the object
// store and comes back, no violation reported); the sign-in page telling a rate-limited person
// how long to wait; and no server secret in the client bundle (.next/static, from the build).
import { readdirSync, readFileSync, statSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { type Page, expect, test } from "@playwright/test";
import { authFile } from "./helpers";

const root = fileURLToPath(new URL("../..", import.meta.url));

/** Collects every CSP violation the page reports (listener added before any page script). */
async function watchCsp(page: Page): Promise<string[]> {
  const seen: string[] = [];
  page.on("console", (m) => {
    if (/Content Security Policy/i.test(m.text())) seen.push(`console: ${m.text()}`);
  });
  await page.exposeFunction("__reportCsp", (s: string) => seen.push(s));
  await page.addInitScript(() => {
    document.addEventListener("securitypolicyviolation", (e) => {
      (window as unknown as { __reportCsp(s: string): void }).__reportCsp(`${e.violatedDirective} blocked ${e.blockedURI}`);
    });
  });
  return seen;
}

function cspOf(value: string | undefined): Map<string, string[]> {
  const out = new Map<string, string[]>();
  for (const part of (value ?? "").split(";")) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (name) out.set(name, sources);
  }
  return out;
}

test("pages carry the security headers and a fresh script nonce that Next puts on its scripts", async ({ request }) => {
  const first = await request.get("/signin");
  const second = await request.get("/signin");
  expect(first.status()).toBe(200);
  const h = first.headers();
  expect(h["x-frame-options"]).toBe("DENY");
  expect(h["x-content-type-options"]).toBe("nosniff");
  expect(h["referrer-policy"]).toBe("strict-origin-when-cross-origin");
  expect(h["permissions-policy"]).toContain("camera=(self)");
  expect(h["permissions-policy"]).toContain("microphone=()");
  expect(h["x-powered-by"]).toBeUndefined();

  const csp = cspOf(h["content-security-policy"]);
  expect(csp.get("frame-ancestors")).toEqual(["'none'"]);
  expect(csp.get("object-src")).toEqual(["'none'"]);
  expect(csp.get("default-src")).toEqual(["'self'"]);
  expect(csp.get("img-src")).toEqual(["'self'", "blob:", "data:"]);
  expect(csp.get("connect-src")).toEqual(["'self'", new URL(process.env.S3_ENDPOINT ?? "http://127.0.0.1:4569").origin]);
  const script = csp.get("script-src")!;
  expect(script).toContain("'strict-dynamic'");
  expect(script).not.toContain("'unsafe-inline'");
  expect(script).not.toContain("'unsafe-eval'");
  const nonce = script.find((s) => s.startsWith("'nonce-"))!.slice(7, -1);
  expect(nonce).toMatch(/^[A-Za-z0-9+/]{22}==$/);
  expect(cspOf(second.headers()["content-security-policy"]).get("script-src")).not.toContain(`'nonce-${nonce}'`);

  // Every script tag in the page (inline bootstrap and chunks alike) carries this response's nonce.
  const html = await first.text();
  const tags = html.match(/<script\b[^>]*>/g) ?? [];
  expect(tags.length).toBeGreaterThan(3);
  for (const tag of tags) expect(tag).toContain(`nonce="${nonce}"`);

  // API answers and static files get the fixed headers too.
  const api = await request.get("/api/health");
  expect(api.headers()["x-content-type-options"]).toBe("nosniff");
  expect(api.headers()["x-frame-options"]).toBe("DENY");
  // The API's own fixed policy, and only that one (the proxy's nonce policy is for pages).
  const apiPolicy = cspOf(api.headers()["content-security-policy"]);
  expect(apiPolicy.get("default-src")).toEqual(["'none'"]);
  expect(apiPolicy.get("frame-ancestors")).toEqual(["'none'"]);
  expect(api.headers()["content-security-policy"]).not.toContain("nonce-");
  const chunk = html.match(/\/_next\/static\/[^"]+\.js/)![0];
  expect((await request.get(chunk)).headers()["x-content-type-options"]).toBe("nosniff");
});

test.describe("signed in", () => {
  test.use({ storageState: authFile("owner") });

  test("the app works under the policy: pages hydrate, a photo is uploaded to the store and shown, nothing is blocked", async ({ page }) => {
    test.setTimeout(120_000);
    const violations = await watchCsp(page);
    await page.goto("/");
    await expect(page).toHaveURL(/\/s\/[0-9a-f-]{36}$/);
    const studioId = page.url().match(/\/s\/([0-9a-f-]{36})/)![1];
    // Hydrated: client navigation works.
    await page.getByRole("link", { name: /Trials/ }).first().click();
    await expect(page).toHaveURL(/\/trials/);

    // The upload path the photo sheet uses: presigned PUT from the page to the object store.
    const result = await page.evaluate(async (studioId) => {
      const post = async (path: string, body?: unknown) => {
        const res = await fetch(path, { method: "POST", headers: { "content-type": "application/json" }, body: body ? JSON.stringify(body) : undefined });
        return { status: res.status, json: await res.json() };
      };
      const trial = await post(`/api/studios/${studioId}/trials`, { title: "Policy check swatch", fibreWeightG: 100 });
      const canvas = document.createElement("canvas");
      canvas.width = 64;
      canvas.height = 64;
      const ctx = canvas.getContext("2d")!;
      ctx.fillStyle = "#5b7f6a";
      ctx.fillRect(0, 0, 64, 64);
      const jpeg = await new Promise<Blob>((r) => canvas.toBlob((b) => r(b!), "image/jpeg", 0.9));
      const start = await post(`/api/studios/${studioId}/photos`, { trialId: trial.json.id, kind: "base", contentType: "image/jpeg", bytes: jpeg.size });
      const put = await new Promise<number>((resolve) => {
        const xhr = new XMLHttpRequest();
        xhr.open("PUT", start.json.uploadUrl);
        xhr.setRequestHeader("content-type", "image/jpeg");
        xhr.onload = () => resolve(xhr.status);
        xhr.onerror = () => resolve(0);
        xhr.send(jpeg);
      });
      const confirm = await post(`/api/studios/${studioId}/photos/${start.json.photo.id}/confirm`);
      return { trialId: trial.json.id as string, uploadUrl: start.json.uploadUrl as string, put, confirm: confirm.status };
    }, studioId);
    expect(new URL(result.uploadUrl).origin).not.toBe(new URL(page.url()).origin);
    expect(result.put).toBe(200);
    expect(result.confirm).toBe(200);

    await page.goto(`/s/${studioId}/trials/${result.trialId}`);
    await expect(page.getByRole("heading", { name: "Policy check swatch" })).toBeVisible({ timeout: 30_000 });
    const img = page.locator('img[src*="/photos/"]').first();
    await expect(img).toBeVisible({ timeout: 30_000 });
    await expect.poll(() => img.evaluate((el: HTMLImageElement) => el.complete && el.naturalWidth > 0)).toBe(true);
    await page.goto(`/s/${studioId}/colourways`);
    await page.goto("/account");
    await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
    expect(violations).toEqual([]);
  });
});

test.describe("rate-limited sign-in", () => {
  // Its own client address, so this test does not use up the address the other tests share.
  test.use({ extraHTTPHeaders: { "x-forwarded-for": `198.51.100.${Math.floor(Math.random() * 250) + 1}` } });

  test("after 10 wrong passwords the page says how long to wait", async ({ page }) => {
    const violations = await watchCsp(page);
    const email = `nobody-${Date.now()}@limit.test`;
    await page.goto("/signin");
    await page.getByLabel("E-mail").fill(email);
    await page.getByLabel("Password").fill("guess");
    for (let i = 0; i < 10; i++) {
      await page.getByRole("button", { name: "Sign in" }).click();
      await expect(page.getByRole("alert").filter({ hasText: "do not match" })).toBeVisible();
      await expect(page.getByRole("button", { name: "Sign in" })).toBeEnabled();
    }
    const answer = page.waitForResponse((r) => r.url().includes("/api/auth/callback/password"));
    await page.getByRole("button", { name: "Sign in" }).click();
    const res = await answer;
    expect(res.status()).toBe(429);
    expect(Number(res.headers()["retry-after"])).toBeGreaterThan(800);
    await expect(
      page.getByRole("alert").filter({ hasText: "Too many sign-in attempts for this address or from this network. Wait 15 minutes, then try again." }),
    ).toBeVisible();
    expect(violations).toEqual([]);
  });
});

test("the client bundle holds no server secret", async () => {
  const dir = join(root, ".next/static");
  const files: string[] = [];
  const walk = (d: string) => {
    for (const name of readdirSync(d)) {
      const p = join(d, name);
      if (statSync(p).isDirectory()) walk(p);
      else files.push(p);
    }
  };
  walk(dir);
  expect(files.filter((f) => f.endsWith(".js")).length).toBeGreaterThan(10);

  const secrets: Record<string, string> = {
    "NEXTAUTH_SECRET": process.env.NEXTAUTH_SECRET ?? "undertone-test-secret-not-for-use",
    "the development NEXTAUTH_SECRET default": "undertone-local-development-secret-change-me",
    "S3_SECRET_ACCESS_KEY": process.env.S3_SECRET_ACCESS_KEY ?? "S3RVER",
    "DATABASE_URL": process.env.E2E_DATABASE_URL ?? "postgres://postgres@127.0.0.1:54329/undertone_e2e",
    "a postgres:// address": "postgres://",
    "a postgresql:// address": "postgresql://",
    "the SMTP address": process.env.SMTP_URL ?? "smtp://127.0.0.1:2525",
  };
  const found: string[] = [];
  for (const f of files) {
    const text = readFileSync(f, "latin1");
    for (const [what, value] of Object.entries(secrets)) if (value && text.includes(value)) found.push(`${what} in ${f.slice(root.length)}`);
  }
  expect(found).toEqual([]);
});
