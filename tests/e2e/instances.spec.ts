// Two app servers on one database hold no state of their own: a session signed in on one is
// good on the other, a trial written through one reads back through the other, a timer started
// on one runs on the other, and a mail queued through one leaves once although both run jobs.
// The first server is Playwright's web server; this spec starts the second on the next port.
import { type ChildProcess, spawn } from "node:child_process";
import { fileURLToPath } from "node:url";
import { type APIRequestContext, expect, request as requestFactory, test } from "@playwright/test";
import { listMessages } from "../support/mail";
import { account } from "./helpers";

const root = fileURLToPath(new URL("../..", import.meta.url));
const PORT_A = Number(process.env.E2E_PORT ?? 3100);
const PORT_B = PORT_A + 1;
const A = `http://127.0.0.1:${PORT_A}`;
const B = `http://127.0.0.1:${PORT_B}`;

let serverB: ChildProcess;
let api: APIRequestContext;

async function answers(url: string): Promise<boolean> {
  try {
    return (await fetch(url)).ok;
  } catch {
    return false;
  }
}

test.beforeAll(async () => {
  test.setTimeout(90_000);
  expect(await answers(`${B}/api/health`), `port ${PORT_B} must be free for the second server`).toBe(false);
  // The same settings as the web server in playwright.config.ts, on another port.
  serverB = spawn(process.execPath, ["node_modules/next/dist/bin/next", "start", "-H", "127.0.0.1", "-p", String(PORT_B)], {
    cwd: root,
    stdio: ["ignore", "ignore", "pipe"],
    env: {
      ...process.env,
      DATABASE_URL: process.env.E2E_DATABASE_URL ?? "postgres://postgres@127.0.0.1:54329/undertone_e2e",
      NEXTAUTH_URL: B,
      APP_URL: B,
      NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET ?? "undertone-test-secret-not-for-use",
      AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: "true",
    },
  });
  serverB.stderr?.on("data", (d) => process.stderr.write(`[server B] ${d}`));
  const deadline = Date.now() + 60_000;
  while (!(await answers(`${B}/api/health`))) {
    expect(serverB.exitCode, "server B exited").toBeNull();
    expect(Date.now() < deadline, "server B answers within 60 s").toBe(true);
    await new Promise((r) => setTimeout(r, 250));
  }
  api = await requestFactory.newContext();
});

test.afterAll(async () => {
  await api?.dispose();
  if (serverB && serverB.exitCode === null) {
    const gone = new Promise((r) => serverB.once("exit", r));
    serverB.kill("SIGTERM");
    await gone;
  }
});

/** Signs in on `base` with the credentials provider over plain HTTP; the cookie jar keeps the session. */
async function signIn(base: string, email: string, password: string) {
  const csrf = await api.get(`${base}/api/auth/csrf`);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const res = await api.post(`${base}/api/auth/callback/password`, {
    form: { csrfToken, email, password, json: "true" },
    maxRedirects: 0,
  });
  expect([200, 302]).toContain(res.status());
  const session = await (await api.get(`${base}/api/auth/session`)).json();
  expect(session.user.email).toBe(email);
}

test("two servers on one database serve the same sessions, trials, timers and mail", async ({ page }) => {
  const owner = account("owner");
  await signIn(A, owner.email, owner.password);

  // The session cookie from A is a JWT signed with the shared secret: B accepts it.
  expect((await (await api.get(`${B}/api/auth/session`)).json()).user.email).toBe(owner.email);
  const studios = (await (await api.get(`${A}/api/studios`)).json()) as { id: string; name: string }[];
  const sid = studios[0].id;

  // A trial written through A reads back through B, over the API and on the page.
  const title = `Two-server check ${Date.now()}`;
  const created = await api.post(`${A}/api/studios/${sid}/trials`, { data: { title, fibreWeightG: 50 } });
  expect(created.status(), await created.text()).toBe(201);
  const trial = (await created.json()) as { id: string };
  const read = await api.get(`${B}/api/studios/${sid}/trials/${trial.id}`);
  expect(read.status()).toBe(200);
  expect((await read.json()).title).toBe(title);

  await page.context().addCookies((await api.storageState()).cookies);
  await page.goto(`${B}/s/${sid}/trials/${trial.id}`);
  // The first page B renders loads its code cold: allow for that on a busy machine.
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(title, { timeout: 30_000 });

  // A timer started on A is running on B, with B's clock counting down the same start time.
  const timer = await api.post(`${A}/api/studios/${sid}/timers`, { data: { trialId: trial.id, label: "Steam", durationSec: 600 } });
  expect(timer.status(), await timer.text()).toBe(201);
  const timerId = ((await timer.json()) as { timer: { id: string } }).timer.id;
  const onB = (await (await api.get(`${B}/api/studios/${sid}/timers?trialId=${trial.id}`)).json()) as {
    items: { id: string; state: string; remainingSec: number }[];
  };
  const seen = onB.items.find((t) => t.id === timerId);
  expect(seen?.state).toBe("running");
  expect(seen!.remainingSec).toBeGreaterThan(590);
  expect(seen!.remainingSec).toBeLessThanOrEqual(600);

  // Both servers run the job workers; an invitation queued through B is mailed exactly once.
  const invitee = `two-servers-${Date.now()}@instances.test`;
  const invited = await api.post(`${B}/api/studios/${sid}/invitations`, { data: { email: invitee, role: "guest" } });
  expect(invited.status(), await invited.text()).toBe(201);
  await expect.poll(async () => (await listMessages(invitee)).length, { timeout: 20_000 }).toBe(1);
  // Long enough for both workers to poll the queue several times more.
  await new Promise((r) => setTimeout(r, 5_000));
  expect(await listMessages(invitee)).toHaveLength(1);

  // Tidy up: the invitation and the trial (the timer goes with it).
  const invitationId = ((await invited.json()) as { id: string }).id;
  await api.delete(`${A}/api/studios/${sid}/invitations/${invitationId}`);
  expect((await api.delete(`${B}/api/studios/${sid}/trials/${trial.id}`)).status()).toBeLessThan(300);
});
