// Layer prediction speed: 2-dye layers over a handful of repeated Lab bases (the usual studio case:
// many recipes tried over the same few bases), plus the cost of a fresh base (one LHTSS solve).
import { fitDyeProfiles, labToReflectance, predictLayer } from "../../colour/spectral";
import { syntheticCalibrationSet } from "../../colour/spectral/synthetic-dyeings";
import type { Lab } from "../../colour/types";

const fmt = (n: number) => Math.round(n).toLocaleString("en-GB").replace(/,/g, " ");

/** Calls per second of wall time, and per second of this process's CPU time (steadier on a busy machine). */
function rate(run: () => void, minMs = 1000): { wall: number; cpu: number } {
  let n = 0;
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  let t = t0;
  while (t - t0 < minMs) {
    for (let i = 0; i < 1000; i++) run();
    n += 1000;
    t = performance.now();
  }
  const c = process.cpuUsage(c0);
  return { wall: (n * 1000) / (t - t0), cpu: (n * 1e6) / (c.user + c.system) };
}

const show = (label: string, r: { wall: number; cpu: number }, goal = "") =>
  console.log(`${label}: ${fmt(r.wall)} /s${goal} (${fmt(r.cpu)} per CPU-second)`);

export default async function prediction(): Promise<void> {
  const fit = fitDyeProfiles(syntheticCalibrationSet());
  if (!fit.ok) throw new Error(fit.message);
  const [a, b] = fit.profiles;
  const bases: Lab[] = [
    { L: 90.4, a: -0.9, b: 7.6 }, { L: 70.7, a: 2.8, b: -2.4 }, { L: 76.6, a: 17.4, b: 2.9 }, { L: 62, a: -20, b: 15 },
    { L: 55, a: 30, b: 35 }, { L: 82, a: 5, b: 40 }, { L: 48, a: -5, b: -25 }, { L: 35, a: 10, b: 5 },
  ];
  let k = 0, sink = 0;
  const uniform = rate(() => {
    const p = predictLayer(bases[k++ & 7], { dyes: [{ profile: a, dosPct: 0.5 + (k & 15) / 10 }, { profile: b, dosPct: 0.3 }] });
    sink += p.lab.L;
  });
  show("layer predictions, 2 dyes over 8 repeated Lab bases", uniform, " (goal ≥ 20 000)");
  const speckle = rate(() => {
    const p = predictLayer(bases[k++ & 7], { dyes: [{ profile: a, dosPct: 2 }, { profile: b, dosPct: 1 }], coverage: 0.2 });
    sink += p.lab.L;
  });
  show("speckle (coverage 0.2) predictions", speckle);
  const gradient = { sections: 5, depths: [1, 0.75, 0.5, 0.25, 0] };
  const dip = rate(() => {
    const p = predictLayer(bases[k++ & 7], { dyes: [{ profile: a, dosPct: 1 }, { profile: b, dosPct: 0.5 }], gradient });
    sink += p.lab.L;
  });
  show("5-section gradient predictions", dip);
  let j = 0;
  const fresh = rate(() => {
    j++;
    sink += labToReflectance({ L: 40 + (j % 50), a: -30 + (j % 61), b: -30 + (j % 67) }).reflectance[0];
  }, 1500);
  show("fresh bases (one LHTSS solve each)", fresh);
  if (sink === 42) console.log(""); // keep the work observable
}
