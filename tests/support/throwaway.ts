// Services of a test's own, to stop and start at will: a temporary PostgreSQL cluster, an
// object-store fake and a mail fake on ports of their own, with their data under a temporary
// folder that is removed afterwards. The shared services are never touched.
import { type ChildProcess, spawn, spawnSync } from "node:child_process";
import { appendFileSync, chmodSync, chownSync, mkdirSync, mkdtempSync, rmSync } from "node:fs";
import { createConnection } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = fileURLToPath(new URL("../..", import.meta.url));

function pgBin(): string {
  const r = spawnSync("bash", ["-c", "ls -d /usr/lib/postgresql/*/bin | sort -V | tail -n 1"], { encoding: "utf8" });
  const dir = r.stdout.trim();
  if (!dir) throw new Error("no PostgreSQL binaries under /usr/lib/postgresql");
  return dir;
}

/** Runs a command as the postgres OS user (initdb refuses root), from / so it can enter its cwd. */
function asPostgres(cmd: string, args: string[]) {
  const asRoot = process.getuid?.() === 0;
  const r = asRoot
    ? spawnSync("runuser", ["-u", "postgres", "--", cmd, ...args], { cwd: "/", encoding: "utf8" })
    : spawnSync(cmd, args, { cwd: "/", encoding: "utf8" });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(" ")} failed (${r.status}):\n${r.stdout}\n${r.stderr}`);
  return r.stdout;
}

/** True when something accepts TCP connections on 127.0.0.1:port. */
export function portOpen(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const s = createConnection({ host: "127.0.0.1", port });
    s.once("connect", () => (s.destroy(), resolve(true)));
    s.once("error", () => resolve(false));
  });
}

export async function waitFor(what: string, check: () => Promise<boolean>, timeoutMs = 20_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error(`${what}: not within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

async function mustBeFree(port: number) {
  if (await portOpen(port)) throw new Error(`port ${port} is taken; the throwaway services need it free`);
}

/** The same as asPostgres without blocking the event loop, so requests in flight go on meanwhile. */
function asPostgresAsync(cmd: string, args: string[]): Promise<void> {
  const asRoot = process.getuid?.() === 0;
  const child = asRoot ? spawn("runuser", ["-u", "postgres", "--", cmd, ...args], { cwd: "/" }) : spawn(cmd, args, { cwd: "/" });
  let err = "";
  child.stderr?.on("data", (d) => (err += d));
  return new Promise((resolve, reject) =>
    child.once("exit", (code) => (code === 0 ? resolve() : reject(new Error(`${cmd} ${args.join(" ")} failed (${code}): ${err}`)))),
  );
}

export interface ThrowawayPostgres {
  port: number;
  url(database: string): string;
  createDatabase(name: string): void;
  start(): Promise<void>;
  /** Stops the server (fast: open connections are closed). */
  stop(): Promise<void>;
  destroy(): void;
}

/** initdb a cluster on `port` under a temporary folder and start it (about 2–3 s). */
export async function throwawayPostgres(port: number): Promise<ThrowawayPostgres> {
  await mustBeFree(port);
  const bin = pgBin();
  const base = mkdtempSync(path.join(tmpdir(), "undertone-pg-"));
  chmodSync(base, 0o755);
  const data = path.join(base, "data");
  mkdirSync(data);
  const asRoot = process.getuid?.() === 0;
  if (asRoot) {
    const ids = spawnSync("id", ["-u", "postgres"], { encoding: "utf8" }).stdout.trim();
    const gid = spawnSync("id", ["-g", "postgres"], { encoding: "utf8" }).stdout.trim();
    chownSync(base, Number(ids), Number(gid));
    chownSync(data, Number(ids), Number(gid));
  }
  chmodSync(data, 0o700);
  asPostgres(`${bin}/initdb`, ["-D", data, "-U", "postgres", "--auth=trust", "--encoding=UTF8", "--no-locale"]);
  const conf = [
    "listen_addresses = '127.0.0.1'",
    `port = ${port}`,
    "unix_socket_directories = ''",
    "fsync = off",
    "synchronous_commit = off",
    "full_page_writes = off",
    "max_connections = 60",
  ].join("\n");
  appendFileSync(path.join(data, "postgresql.conf"), `\n${conf}\n`);
  const log = path.join(base, "server.log");
  const pgCtl = (...args: string[]) => asPostgres(`${bin}/pg_ctl`, ["-D", data, "-l", log, "-w", "-t", "30", ...args]);
  const pgCtlAsync = (...args: string[]) => asPostgresAsync(`${bin}/pg_ctl`, ["-D", data, "-l", log, "-w", "-t", "30", ...args]);
  const psql = (sql: string) =>
    spawnSync(`${bin}/psql`, ["-X", "-q", "-v", "ON_ERROR_STOP=1", "-h", "127.0.0.1", "-p", String(port), "-U", "postgres", "-d", "postgres", "-c", sql], {
      encoding: "utf8",
    });
  pgCtl("start");
  return {
    port,
    url: (db) => `postgres://postgres@127.0.0.1:${port}/${db}`,
    createDatabase(name) {
      const r = psql(`create database "${name}"`);
      if (r.status !== 0) throw new Error(r.stderr);
    },
    start: () => pgCtlAsync("start"),
    stop: () => pgCtlAsync("stop", "-m", "fast"),
    destroy() {
      try {
        pgCtl("stop", "-m", "immediate");
      } catch {
        // already stopped
      }
      rmSync(base, { recursive: true, force: true });
    },
  };
}

/** Migrates a database with the project's migrations (the CLI under tsx, as the app does). */
export function migrate(databaseUrl: string) {
  const r = spawnSync("npm", ["run", "--silent", "migrate"], { cwd: root, env: { ...process.env, DATABASE_URL: databaseUrl }, encoding: "utf8" });
  if (r.status !== 0) throw new Error(`migrate failed:\n${r.stdout}\n${r.stderr}`);
}

export interface ThrowawayFake {
  start(): Promise<void>;
  stop(): Promise<void>;
  destroy(): Promise<void>;
}

/** One of the project's fakes (scripts/s3-fake.ts, scripts/mail-fake.ts) as a child process. */
function fake(script: string, port: number, env: Record<string, string>): ThrowawayFake {
  const dataDir = mkdtempSync(path.join(tmpdir(), "undertone-fake-"));
  let child: ChildProcess | null = null;
  const fakeEnv = { ...process.env, ...env, UNDERTONE_DATA_DIR: dataDir };
  return {
    async start() {
      await mustBeFree(port);
      child = spawn(process.execPath, ["--import", "tsx", script], { cwd: root, env: fakeEnv, stdio: "ignore" });
      await waitFor(`${script} on ${port}`, () => portOpen(port));
    },
    async stop() {
      const c = child;
      child = null;
      if (!c || c.exitCode !== null) return;
      const gone = new Promise((r) => c.once("exit", r));
      c.kill("SIGKILL");
      await gone;
      await waitFor(`${script} off ${port}`, async () => !(await portOpen(port)));
    },
    async destroy() {
      await this.stop();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

export const throwawayS3 = (port: number) => fake("scripts/s3-fake.ts", port, { S3_PORT: String(port) });

export const throwawayMail = (smtpPort: number, httpPort: number) =>
  fake("scripts/mail-fake.ts", httpPort, { SMTP_PORT: String(smtpPort), MAIL_HTTP_PORT: String(httpPort) });
