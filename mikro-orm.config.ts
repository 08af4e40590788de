import { defineConfig } from "@mikro-orm/postgresql";
import { Migrator } from "@mikro-orm/migrations";
import { entities } from "./entities";
import { migrationsList } from "./migrations";

// The one ORM configuration, used by the app, the CLI (migrations) and the scripts.
// Read DATABASE_URL directly: lib/env.ts is server-only app code and the CLI loads this file too.
export default defineConfig({
  clientUrl: process.env.DATABASE_URL ?? "postgres://postgres@127.0.0.1:54329/undertone",
  entities,
  discovery: { disableDynamicFileAccess: true },
  extensions: [Migrator],
  migrations: {
    path: "./migrations",
    pathTs: "./migrations",
    migrationsList,
    transactional: true,
    allOrNothing: true,
    snapshot: false,
    emit: "ts",
  },
  // pg-boss keeps its job tables in their own schema and migrates them itself (lib/jobs/boss.ts).
  schemaGenerator: { ignoreSchema: ["pgboss"] },
  pool: { min: 0, max: 10 },
  debug: false,
});
