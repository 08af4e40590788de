// npm run bench – runs every benchmark module in scripts/bench/ and prints its figures.
// Each module default-exports `async () => void` and prints its own lines.
import { readdirSync } from "node:fs";
import { join } from "node:path";
import { pathToFileURL } from "node:url";

const dir = join(import.meta.dirname, "bench");
const only = process.argv[2];
const files = readdirSync(dir)
  .filter((f) => f.endsWith(".ts") && (!only || f.includes(only)))
  .sort();

console.log(`Undertone benchmarks — node ${process.version}, ${new Date().toISOString()}`);
for (const f of files) {
  console.log(`\n== ${f.replace(/\.ts$/, "")} ==`);
  const mod = await import(pathToFileURL(join(dir, f)).href);
  await mod.default();
}
