// npm run load [-- --db NAME --port 3400 --seconds 10 --connections 32 --trials 10000 --only list --profile DIR]
// The load check: a database with the demo studio and 10 000 trials (created, migrated and filled
// when needed), `next start` on that database (built first when the sources are newer than the
// build), a sign-in as the demo owner, then autocannon against four API scenarios one after the
// other. Prints p50/p95/p99 latency, requests per second and errors (non-2xx) per scenario and
// whether each read meets p95 ≤ 50 ms. It reports; it does not fail. The server it starts is
// stopped at the end, also on Ctrl-C.
//
// The load generator runs on the same machine as the server and Postgres and takes CPU from them;
// Besides latency it reports CPU milliseconds per request of the Next process and of the Postgres
// backends serving the load database (from /proc): steadier than latency when others share the CPU.
import autocannon, { type Request as CannonRequest, type Result as CannonResult } from "autocannon";
import { MikroORM } from "@mikro-orm/postgresql";
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { randomBytes } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, readdirSync, statSync, unlinkSync, writeFileSync } from "node:fs";
import { availableParallelism } from "node:os";
import { join } from "node:path";
import { parseArgs } from "node:util";
import config from "../mikro-orm.config";
import { env } from "../lib/env";
import { seedLoadTrials } from "./load/seed-trials";

const { values: opt } = parseArgs({
  options: {
    db: { type: "string", default: "undertone_load" },
    port: { type: "string", default: "3400" },
    seconds: { type: "string", default: "10" },
    connections: { type: "string", default: "32" },
    trials: { type: "string", default: "10000" },
    only: { type: "string" },
    /** Folder for a V8 CPU profile of the server (node --cpu-prof), written when it stops. */
    profile: { type: "string" },
  },
});

const root = join(import.meta.dirname, "..");
const port = Number(opt.port);
const origin = `http://127.0.0.1:${port}`;
const seconds = Number(opt.seconds);
const connections = Number(opt.connections);
const GOAL_P95_MS = 50;
const WARM_UP_SECONDS = 3;
const dbUrl = Object.assign(new URL(env.DATABASE_URL), { pathname: `/${opt.db}` }).href;
const pidFile = join(root, ".data", `load-server-${port}.pid`);
const owner = (JSON.parse(readFileSync(join(root, "scripts", "demo-accounts.json"), "utf8")) as { email: string; password: string; role: string }[]).find(
  (a) => a.role === "owner",
)!;

function step(msg: string) {
  console.log(`load: ${msg}`);
}

function run(cmd: string, args: string[], extraEnv: Record<string, string> = {}) {
  const r = spawnSync(cmd, args, { cwd: root, env: { ...process.env, ...extraEnv }, encoding: "utf8" });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(" ")} failed:\n${r.stdout}\n${r.stderr}`);
}

// ---------------------------------------------------------------- database

async function prepareDatabase(): Promise<{ studioId: string; trialIds: string[] }> {
  const admin = await MikroORM.init({ ...config, clientUrl: Object.assign(new URL(dbUrl), { pathname: "/postgres" }).href, pool: { min: 0, max: 1 } });
  try {
    const found = await admin.em.execute("select 1 from pg_database where datname = ?", [opt.db]);
    if (found.length === 0) {
      step(`creating database ${opt.db}`);
      await admin.em.execute(`create database "${opt.db!.replace(/"/g, '""')}"`);
    }
  } finally {
    await admin.close();
  }
  step(`migrating and seeding ${opt.db}`);
  run("npm", ["run", "--silent", "migrate"], { DATABASE_URL: dbUrl });
  run("npm", ["run", "--silent", "seed"], { DATABASE_URL: dbUrl });
  const orm = await MikroORM.init({ ...config, clientUrl: dbUrl, pool: { min: 0, max: 2 } });
  try {
    const t = Date.now();
    const r = await seedLoadTrials(orm.em.fork(), Number(opt.trials));
    const em = orm.em.fork();
    // Fresh planner statistics after a bulk insert; no mail left over from an earlier run.
    await em.execute("analyze");
    await em.execute("delete from mail_outbox");
    step(
      `${r.trials} trials, ${r.layers} layers, ${r.readings} readings in the demo studio` +
        (r.added ? ` (${r.added} trials added in ${((Date.now() - t) / 1000).toFixed(1)} s)` : ""),
    );
    const ids = await em.execute<{ id: string }[]>(
      "select id from trials where studio_id = ? order by md5(id::text) limit 500",
      [r.studioId],
    );
    return { studioId: r.studioId, trialIds: ids.map((x) => x.id) };
  } finally {
    await orm.close();
  }
}

// ---------------------------------------------------------------- build and server

const BUILD_INPUTS = ["app", "components", "lib", "entities", "colour", "migrations", "public", "types", "next.config.mjs", "postcss.config.mjs", "tsconfig.json", "package.json", "package-lock.json", "mikro-orm.config.ts"];

function newestInput(path: string): number {
  if (!existsSync(path)) return 0;
  const s = statSync(path);
  if (!s.isDirectory()) return s.mtimeMs;
  return Math.max(s.mtimeMs, ...readdirSync(path).map((f) => newestInput(join(path, f))));
}

function ensureBuild() {
  const buildId = join(root, ".next", "BUILD_ID");
  const builtAt = existsSync(buildId) ? statSync(buildId).mtimeMs : 0;
  const changed = Math.max(...BUILD_INPUTS.map((p) => newestInput(join(root, p))));
  if (changed <= builtAt) return step("the build is up to date");
  step("building (next build; sources are newer than the build)");
  run("npm", ["run", "--silent", "build"]);
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

/** Stops a server an interrupted earlier run left behind (its own pid file, and only a next process). */
function stopLeftover() {
  if (!existsSync(pidFile)) return;
  const pid = Number(readFileSync(pidFile, "utf8"));
  const cmd = existsSync(`/proc/${pid}/cmdline`) ? readFileSync(`/proc/${pid}/cmdline`, "utf8") : "";
  if (pid > 0 && alive(pid) && cmd.includes("next")) {
    step(`stopping the server an earlier run left (pid ${pid})`);
    process.kill(-pid, "SIGKILL");
  }
  unlinkSync(pidFile);
}

let server: ChildProcess | null = null;

async function startServer(): Promise<number> {
  stopLeftover();
  if (await fetch(origin).then(() => true, () => false)) {
    throw new Error(`port ${port} is taken by another program; choose another with --port`);
  }
  const log: string[] = [];
  const prof = opt.profile ? ["--cpu-prof", `--cpu-prof-dir=${opt.profile}`] : [];
  server = spawn(process.execPath, [...prof, join(root, "node_modules/next/dist/bin/next"), "start", "-H", "127.0.0.1", "-p", String(port)], {
    cwd: root,
    detached: true, // its own process group, stopped as a whole
    stdio: ["ignore", "pipe", "pipe"],
    env: {
      ...process.env,
      NODE_ENV: "production",
      DATABASE_URL: dbUrl,
      NEXTAUTH_URL: origin,
      NEXTAUTH_SECRET: randomBytes(24).toString("hex"),
      // Notification mail from the comment scenario never leaves: not due for a day, and no SMTP server there.
      MAIL_BATCH_SECONDS: "86400",
      SMTP_URL: "smtp://127.0.0.1:9",
    },
  });
  const pid = server.pid!;
  mkdirSync(join(root, ".data"), { recursive: true });
  writeFileSync(pidFile, String(pid));
  const keep = (d: Buffer) => log.push(d.toString());
  server.stdout!.on("data", keep);
  server.stderr!.on("data", keep);
  for (let i = 0; i < 120; i++) {
    if (server.exitCode !== null) break;
    const ok = await fetch(`${origin}/api/auth/csrf`).then((r) => r.ok, () => false);
    if (ok) return pid;
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`next start did not answer on ${origin} within 60 s:\n${log.join("").slice(-2000)}`);
}

async function stopServer() {
  const s = server;
  server = null;
  if (!s?.pid) return;
  if (s.exitCode === null) {
    const exited = new Promise((r) => s.once("exit", r));
    try {
      process.kill(-s.pid, "SIGTERM");
    } catch {
      /* gone already */
    }
    const timeout = setTimeout(() => {
      try {
        process.kill(-s.pid!, "SIGKILL");
      } catch {
        /* gone */
      }
    }, 5000);
    await exited;
    clearTimeout(timeout);
  }
  if (existsSync(pidFile)) unlinkSync(pidFile);
}

for (const sig of ["SIGINT", "SIGTERM"] as const) {
  process.once(sig, () => {
    void stopServer().finally(() => process.exit(130));
  });
}

const TICKS_PER_SECOND = 100; // USER_HZ on Linux

/** utime + stime in seconds of every process that `pick` accepts, from /proc. */
function cpuSeconds(pick: (stat: string[], cmdline: string) => boolean): number {
  let sum = 0;
  for (const p of readdirSync("/proc").filter((f) => /^\d+$/.test(f))) {
    try {
      const raw = readFileSync(`/proc/${p}/stat`, "utf8");
      const f = raw.slice(raw.lastIndexOf(")") + 2).split(" ");
      if (pick(f, readFileSync(`/proc/${p}/cmdline`, "utf8"))) sum += (Number(f[11]) + Number(f[12])) / TICKS_PER_SECOND;
    } catch {
      /* exited meanwhile */
    }
  }
  return sum;
}

/** CPU used so far by the server (its process group) and by the Postgres backends serving the load database. */
function cpuNow(pgid: number): { server: number; db: number } {
  return {
    server: cpuSeconds((f) => Number(f[2]) === pgid),
    db: cpuSeconds((_f, cmd) => cmd.startsWith("postgres: ") && cmd.includes(` ${opt.db} `)),
  };
}

function loadAverage(): number {
  return Number(readFileSync("/proc/loadavg", "utf8").split(" ")[0]);
}

// ---------------------------------------------------------------- sign-in and scenarios

/** Signs in through next-auth's credentials flow; returns the Cookie header to send. */
async function signIn(): Promise<string> {
  const jar = new Map<string, string>();
  const keep = (r: Response) => {
    for (const c of r.headers.getSetCookie()) {
      const [pair] = c.split(";");
      const i = pair.indexOf("=");
      jar.set(pair.slice(0, i), pair.slice(i + 1));
    }
  };
  const header = () => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
  const csrfRes = await fetch(`${origin}/api/auth/csrf`);
  keep(csrfRes);
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const res = await fetch(`${origin}/api/auth/callback/password`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: header() },
    body: new URLSearchParams({ csrfToken, email: owner.email, password: owner.password, callbackUrl: origin, json: "true" }),
  });
  keep(res);
  if (![...jar.keys()].some((k) => k.endsWith("session-token"))) {
    throw new Error(`sign-in as ${owner.email} failed (HTTP ${res.status}): ${(await res.text()).slice(0, 300)}`);
  }
  return header();
}

interface Scenario {
  name: string;
  read: boolean;
  /** A yardstick, not a product read: what Next itself costs on this machine, without the app's work. */
  reference?: boolean;
  method: "GET" | "POST";
  /** The path of the n-th request. */
  path: (n: number) => string;
  body?: (n: number) => string;
}

function scenarios(studioId: string, trialIds: string[]): Scenario[] {
  const s = `/api/studios/${studioId}`;
  const targets = Array.from({ length: 64 }, (_, i) => ({ L: 20 + ((i * 13) % 70), a: -40 + ((i * 29) % 80), b: -40 + ((i * 17) % 80) }));
  return [
    // A route that does nothing (no session, no query): the most this machine serves through Next.
    { name: "liveness (reference)", read: true, reference: true, method: "GET", path: () => "/api/health/live" },
    { name: "trial list", read: true, method: "GET", path: (n) => `${s}/trials?page=${1 + (n % 50)}&pageSize=20` },
    { name: "trial page", read: true, method: "GET", path: (n) => `${s}/trials/${trialIds[n % trialIds.length]}` },
    {
      name: "colour search",
      read: true,
      method: "GET",
      path: (n) => {
        const t = targets[n % targets.length];
        return `${s}/colour-search?L=${t.L}&a=${t.a}&b=${t.b}&limit=10`;
      },
    },
    {
      name: "comment post",
      read: false,
      method: "POST",
      path: (n) => `${s}/trials/${trialIds[n % 100]}/comments`,
      body: (n) =>
        JSON.stringify({ body: { type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text: `Load check note ${n}: rinse ran clear.` }] }] } }),
    },
  ];
}

interface Figures {
  name: string;
  read: boolean;
  reference: boolean;
  requests: number;
  rps: number;
  p50: number;
  p95: number;
  p99: number;
  errors: number;
  /** CPU milliseconds per request: the Next process, and the Postgres backends of its database. */
  serverCpuMs: number;
  dbCpuMs: number;
  /** The machine's 1-minute load average at the end of the scenario. */
  loadAvg: number;
  /** What the errors were: non-2xx answers, timeouts (autocannon's 10 s), connection failures. */
  errorKinds: string;
}

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))];
}

async function runScenario(sc: Scenario, cookie: string, pid: number): Promise<Figures> {
  const headers = { cookie, "content-type": "application/json" };
  // Warm-up: a few requests one at a time, so the first measured ones do not load code, then
  // WARM_UP_SECONDS at full concurrency, not measured, so V8 has compiled the hot paths as it
  // would have on a server that has been up a while (reads only: a write would change the data).
  for (let n = 0; n < 10; n++) {
    await fetch(origin + sc.path(n), { method: sc.method, headers, body: sc.body?.(n) }).then((r) => r.arrayBuffer());
  }
  if (sc.read) {
    await new Promise((resolve, reject) =>
      autocannon({ url: origin, connections, duration: WARM_UP_SECONDS, headers, requests: [{ method: sc.method, path: sc.path(0) }] }, (err, res) =>
        err ? reject(err) : resolve(res),
      ),
    );
  }
  let n = 0;
  const request: CannonRequest = {
    method: sc.method,
    setupRequest: (req) => {
      const i = n++;
      return { ...req, path: sc.path(i), ...(sc.body ? { body: sc.body(i) } : {}) };
    },
  };
  const latencies: number[] = [];
  let firstError: string | undefined;
  const cpu0 = cpuNow(pid);
  const result = await new Promise<CannonResult>((resolve, reject) => {
    const instance = autocannon({ url: origin, connections, duration: seconds, headers, requests: [request] }, (err, res) =>
      err ? reject(err) : resolve(res),
    );
    instance.on("response", (_client, status, _bytes, ms) => {
      latencies.push(ms);
      if ((status < 200 || status > 299) && !firstError) firstError = `HTTP ${status}`;
    });
  });
  const cpu1 = cpuNow(pid);
  latencies.sort((a, b) => a - b);
  return {
    name: sc.name,
    read: sc.read,
    reference: sc.reference ?? false,
    requests: latencies.length,
    rps: latencies.length / seconds,
    p50: percentile(latencies, 50),
    p95: percentile(latencies, 95),
    p99: percentile(latencies, 99),
    errors: result.non2xx + result.errors + result.timeouts,
    errorKinds: [
      result.non2xx ? `${result.non2xx} non-2xx${firstError ? `, first ${firstError}` : ""}` : "",
      result.timeouts ? `${result.timeouts} timed out` : "",
      result.errors - result.timeouts > 0 ? `${result.errors - result.timeouts} failed` : "",
    ]
      .filter(Boolean)
      .join(", "),
    serverCpuMs: ((cpu1.server - cpu0.server) * 1000) / Math.max(1, latencies.length),
    dbCpuMs: ((cpu1.db - cpu0.db) * 1000) / Math.max(1, latencies.length),
    loadAvg: loadAverage(),
  };
}

function report(all: Figures[]) {
  const ms = (v: number) => (Number.isFinite(v) ? v.toFixed(1) : "–");
  const rows = [
    ["scenario", "requests", "req/s", "p50 ms", "p95 ms", "p99 ms", "errors", "CPU ms/req app", "db", "load avg", "goal (reads: p95 ≤ 50 ms)"],
    ...all.map((f) => [
      f.name,
      String(f.requests),
      f.rps.toFixed(0),
      ms(f.p50),
      ms(f.p95),
      ms(f.p99),
      String(f.errors) + (f.errorKinds ? ` (${f.errorKinds})` : ""),
      f.serverCpuMs.toFixed(1),
      f.dbCpuMs.toFixed(1),
      f.loadAvg.toFixed(1),
      f.reference
        ? `yardstick (p95 ${ms(f.p95)} ms)`
        : f.read ? (f.p95 <= GOAL_P95_MS && f.errors === 0 ? "met" : `MISSED (p95 ${ms(f.p95)} ms${f.errors ? `, ${f.errors} errors` : ""})`) : "write, no goal",
    ]),
  ];
  const widths = rows[0].map((_, i) => Math.max(...rows.map((r) => r[i].length)));
  console.log("");
  for (const r of rows) console.log(r.map((c, i) => (i === 0 || i === 10 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join("  "));
  // Little's law: with c requests always in flight, the mean latency is c ÷ throughput.
  console.log(`\nWith ${connections} connections, a mean latency of ${GOAL_P95_MS} ms needs ${Math.round((connections * 1000) / GOAL_P95_MS)} requests/s (connections ÷ throughput).`);
  const reads = all.filter((f) => f.read && !f.reference);
  const met = reads.filter((f) => f.p95 <= GOAL_P95_MS && f.errors === 0).length;
  console.log(`reads meeting p95 ≤ ${GOAL_P95_MS} ms: ${met} of ${reads.length}` + (met === reads.length ? " — goal met" : " — goal missed"));
  const cores = availableParallelism();
  console.log(`(${connections} connections, ${seconds} s each; autocannon, the server and Postgres share this machine's ${cores} cores)`);
  const busiest = Math.max(...all.map((f) => f.loadAvg));
  if (busiest > cores) {
    console.log(
      `note: the load average reached ${busiest.toFixed(1)} on ${cores} cores, so other work competed for the CPU and the ` +
        "latencies are worse than this app alone would show; CPU ms per request is the steadier figure to compare.",
    );
  }
}

// ---------------------------------------------------------------- main

try {
  const { studioId, trialIds } = await prepareDatabase();
  ensureBuild();
  step(`starting next start on ${origin}`);
  const pid = await startServer();
  const cookie = await signIn();
  step(`signed in as ${owner.email}; ${connections} connections, ${seconds} s per scenario`);
  const all: Figures[] = [];
  for (const sc of scenarios(studioId, trialIds)) {
    if (opt.only && !sc.name.includes(opt.only)) continue;
    step(`running ${sc.name}`);
    all.push(await runScenario(sc, cookie, pid));
  }
  report(all);
} finally {
  await stopServer();
}
if (opt.profile) {
  step(`CPU profile of the server in ${opt.profile}; summarise it with node --import tsx scripts/load/profile-summary.ts FILE --from SECONDS`);
}
