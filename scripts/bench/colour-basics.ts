// Bulk sRGB→Lab and CIEDE2000 throughput, ours and culori's side by side in one run.
import { availableParallelism, loadavg } from "node:os";
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

/**
 * Best rates (items per second) of two workloads timed in alternation, so that both see the same
 * machine load; each function processes its stated number of items and returns a checksum.
 */
function rates(rounds: number, a: [number, () => number], b: [number, () => number]): [number, number] {
  const best = [0, 0];
  let sink = 0;
  for (let i = 0; i < rounds; i++) {
    [a, b].forEach(([items, fn], k) => {
      const t0 = performance.now();
      sink += fn();
      best[k] = Math.max(best[k], items / ((performance.now() - t0) / 1000));
    });
  }
  if (Number.isNaN(sink)) console.log("(checksum was NaN)");
  return [best[0], best[1]];
}

const fmt = (perSecond: number) => `${(perSecond / 1e6).toFixed(1)} M`;

export default async function colourBasics(): Promise<void> {
  const random = rng(42);

  // 1 M random RGBA pixels (a 1000×1000 photo crop).
  const nPx = 1_000_000;
  const pixels = new Uint8Array(nPx * 4);
  for (let i = 0; i < pixels.length; i++) pixels[i] = Math.floor(random() * 256);
  const out = new Float32Array(nPx * 3);
  const toLab = converter("lab65");
  const nRef = 200_000;
  const [ours, theirs] = rates(
    9,
    [nPx, () => bulkSrgbToLab(pixels, 4, out)[7]],
    [nRef, () => {
      let s = 0;
      for (let i = 0, p = 0; i < nRef; i++, p += 4) {
        s += toLab({ mode: "rgb", r: pixels[p] / 255, g: pixels[p + 1] / 255, b: pixels[p + 2] / 255 }).l;
      }
      return s;
    }],
  );
  console.log(`bulk sRGB→Lab: ${fmt(ours)} px/s (culori ${fmt(theirs)} px/s, ${(ours / theirs).toFixed(1)}×)`);

  // ΔE2000 on 200 000 random Lab pairs, both given Lab values.
  const nPairs = 200_000;
  const labs: Lab[] = Array.from({ length: nPairs * 2 }, () => ({ L: random() * 100, a: random() * 200 - 100, b: random() * 200 - 100 }));
  const culoriLabs = labs.map((x) => ({ mode: "lab65" as const, l: x.L, a: x.a, b: x.b }));
  const de = differenceCiede2000();
  const [ourDe, theirDe] = rates(
    9,
    [nPairs, () => {
      let s = 0;
      for (let i = 0; i < nPairs; i++) s += deltaE00(labs[2 * i], labs[2 * i + 1]);
      return s;
    }],
    [nPairs, () => {
      let s = 0;
      for (let i = 0; i < nPairs; i++) s += de(culoriLabs[2 * i], culoriLabs[2 * i + 1]);
      return s;
    }],
  );
  console.log(`ΔE2000: ${fmt(ourDe)} pairs/s (culori ${fmt(theirDe)} pairs/s, ${(ourDe / theirDe).toFixed(1)}×)`);
  // Other work on the machine lowers both rates; the ratios hold better because the runs alternate.
  console.log(`(load average ${loadavg()[0].toFixed(1)} on ${availableParallelism()} cores)`);
}
