// Bulk sRGB→Lab and CIEDE2000 throughput, ours and culori's side by side in one run.
import { converter, differenceCiede2000 } from "culori";
import { deltaE00 } from "../../colour/difference";
import { bulkSrgbToLab } from "../../colour/spaces";
import type { Lab } from "../../colour/types";

function rng(seed: number) {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Best rate (items per second) of `rounds` timed runs of `fn`, which processes `items` items. */
function rate(items: number, rounds: number, fn: () => number): number {
  let best = 0, sink = 0;
  for (let i = 0; i < rounds; i++) {
    const t0 = performance.now();
    sink += fn();
    const s = (performance.now() - t0) / 1000;
    best = Math.max(best, items / s);
  }
  if (Number.isNaN(sink)) console.log("(sink)");
  return best;
}

const fmt = (perSecond: number) => `${(perSecond / 1e6).toFixed(1)} M`;

export default async function colourBasics(): Promise<void> {
  const random = rng(42);

  // 1 M random RGBA pixels (a 1000×1000 photo crop).
  const nPx = 1_000_000;
  const pixels = new Uint8Array(nPx * 4);
  for (let i = 0; i < pixels.length; i++) pixels[i] = Math.floor(random() * 256);
  const out = new Float32Array(nPx * 3);
  const ours = rate(nPx, 7, () => bulkSrgbToLab(pixels, 4, out)[7]);
  const toLab = converter("lab65");
  const nRef = 200_000;
  const theirs = rate(nRef, 5, () => {
    let s = 0;
    for (let i = 0, p = 0; i < nRef; i++, p += 4) {
      s += toLab({ mode: "rgb", r: pixels[p] / 255, g: pixels[p + 1] / 255, b: pixels[p + 2] / 255 }).l;
    }
    return s;
  });
  console.log(`bulk sRGB→Lab: ${fmt(ours)} px/s (culori ${fmt(theirs)} px/s, ${(ours / theirs).toFixed(1)}×)`);

  // ΔE2000 on 200 000 random Lab pairs, both given Lab values.
  const nPairs = 200_000;
  const labs: Lab[] = Array.from({ length: nPairs * 2 }, () => ({ L: random() * 100, a: random() * 200 - 100, b: random() * 200 - 100 }));
  const culoriLabs = labs.map((x) => ({ mode: "lab65" as const, l: x.L, a: x.a, b: x.b }));
  const ourDe = rate(nPairs, 7, () => {
    let s = 0;
    for (let i = 0; i < nPairs; i++) s += deltaE00(labs[2 * i], labs[2 * i + 1]);
    return s;
  });
  const de = differenceCiede2000();
  const theirDe = rate(nPairs, 7, () => {
    let s = 0;
    for (let i = 0; i < nPairs; i++) s += de(culoriLabs[2 * i], culoriLabs[2 * i + 1]);
    return s;
  });
  console.log(`ΔE2000: ${fmt(ourDe)} pairs/s (culori ${fmt(theirDe)} pairs/s, ${(ourDe / theirDe).toFixed(1)}×)`);
}
