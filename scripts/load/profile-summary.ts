// node --import tsx scripts/load/profile-summary.ts FILE.cpuprofile [--from S] [--to S]
// Where a V8 CPU profile of the server (npm run load -- --profile DIR) spent its time: inclusive
// and self shares by npm package, Node internals or our own source file (the .next bundles are
// mapped back through their source maps). --from/--to keep the samples between those seconds
// of the profile, e.g. to leave out the server's start-up.
import { existsSync, readFileSync } from "node:fs";
import { SourceMap } from "node:module";
import { fileURLToPath } from "node:url";
import { parseArgs } from "node:util";

interface CallFrame {
  functionName: string;
  url: string;
  lineNumber: number;
  columnNumber: number;
}
interface ProfileNode {
  id: number;
  callFrame: CallFrame;
  children?: number[];
}
interface Profile {
  nodes: ProfileNode[];
  startTime: number;
  samples: number[];
  timeDeltas: number[];
}

const { values, positionals } = parseArgs({ allowPositionals: true, options: { from: { type: "string" }, to: { type: "string" } } });
if (!positionals[0]) throw new Error("Name a .cpuprofile file.");
const profile = JSON.parse(readFileSync(positionals[0], "utf8")) as Profile;
const from = Number(values.from ?? 0);
const to = Number(values.to ?? Infinity);

const nodes = new Map(profile.nodes.map((n) => [n.id, n]));
const parent = new Map<number, number>();
for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);

function packageOf(path: string): string {
  const parts = path.split("node_modules/").pop()!.split("/");
  return parts[0].startsWith("@") ? `${parts[0]}/${parts[1]}` : parts[0];
}

const maps = new Map<string, SourceMap | null>();
/** The package, Node module or source file a frame belongs to. */
function ownerOf(cf: CallFrame): string {
  if (!cf.url) return "(native)";
  if (!cf.url.includes("/.next/")) return cf.url.includes("node_modules/") ? packageOf(cf.url) : cf.url;
  const path = cf.url.startsWith("file://") ? fileURLToPath(cf.url) : cf.url;
  if (!maps.has(path)) {
    maps.set(path, existsSync(`${path}.map`) ? new SourceMap(JSON.parse(readFileSync(`${path}.map`, "utf8"))) : null);
  }
  const source = maps.get(path)?.findEntry(cf.lineNumber, cf.columnNumber);
  const original = source && "originalSource" in source ? decodeURIComponent(source.originalSource) : "";
  if (!original) return "(app bundle)";
  return original.includes("node_modules/") ? packageOf(original) : original.replace(/^.*?\[project\]\//, "").replace(/^(\.\.\/)+/, "");
}

const owners = new Map<number, string>();
const owner = (id: number) => {
  if (!owners.has(id)) owners.set(id, ownerOf(nodes.get(id)!.callFrame));
  return owners.get(id)!;
};

const selfTime = new Map<number, number>();
let t = profile.startTime;
profile.samples.forEach((id, i) => {
  t += profile.timeDeltas[i];
  const s = (t - profile.startTime) / 1e6;
  if (s >= from && s < to) selfTime.set(id, (selfTime.get(id) ?? 0) + profile.timeDeltas[i]);
});
const total = [...selfTime.values()].reduce((a, b) => a + b, 0);

const inclusive = new Map<string, number>();
const self = new Map<string, number>();
for (const [id, us] of selfTime) {
  self.set(owner(id), (self.get(owner(id)) ?? 0) + us);
  const seen = new Set<string>();
  for (let cur: number | undefined = id; cur !== undefined; cur = parent.get(cur)) {
    const o = owner(cur);
    if (!seen.has(o)) {
      seen.add(o);
      inclusive.set(o, (inclusive.get(o) ?? 0) + us);
    }
  }
}

const show = (title: string, m: Map<string, number>, n: number) => {
  console.log(`\n${title}`);
  for (const [k, us] of [...m].sort((a, b) => b[1] - a[1]).slice(0, n)) console.log(`${((us / total) * 100).toFixed(1).padStart(5)}%  ${k}`);
};
console.log(`${(total / 1e6).toFixed(1)} s of samples between ${from} s and ${Number.isFinite(to) ? `${to} s` : "the end"}`);
show("inclusive (time in it and what it called)", inclusive, 30);
show("self (time in its own code)", self, 20);
