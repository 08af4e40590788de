// vitest globalSetup for the integration project: the local services are up, the test
// database exists and is migrated, and every test worker talks to undertone_test.
// Migrations run through the MikroORM CLI under tsx in a child process, because vitest
// cannot load the .ts migrations through the migrator itself.
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";

const root = fileURLToPath(new URL("../..", import.meta.url));

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv = process.env) {
  const r = spawnSync(cmd, args, { cwd: root, env, encoding: "utf8" });
  if (r.status !== 0) {
    throw new Error(`${cmd} ${args.join(" ")} failed (${r.status ?? r.signal}):\n${r.stdout}\n${r.stderr}`);
  }
}

export default function setup() {
  const port = process.env.PG_PORT ?? "54329";
  const url = process.env.TEST_DATABASE_URL ?? `postgres://postgres@127.0.0.1:${port}/undertone_test`;
  process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED = "true";
  // scripts/test.sh has just started the services and migrated a fresh test database.
  if (process.env.UNDERTONE_TEST_DB_READY !== "1") {
    // Idempotent and quick when everything already runs; creates undertone_test when missing.
    run("bash", ["scripts/services.sh", "start"]);
    run("npm", ["run", "--silent", "migrate"], { ...process.env, DATABASE_URL: url });
  }
  // Workers start after this and inherit the environment.
  process.env.DATABASE_URL = url;
}
