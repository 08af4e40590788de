// From calibrated pixel samples to colour groups: clustering, exclusions, robust means, palette.
//
// Pixels are clustered in CIELAB with lightness at half weight — the textile convention of
// CMC(2:1) and CIEDE2000 with kL = 2, and here also because strand shading spreads a yarn's
// lightness far more than its hue. k is chosen on a 1 200-pixel subsample: the largest k (≤ 6) whose
// clusters each hold ≥ 3 % and lie ≥ 5 ΔE00 (kL = 2) apart. Clusters that are shadow, glint or colour bleed are told
// apart in roles.ts; inside each colour cluster a band around the lit level (lit.ts) cuts the dark
// tail and the bright low-chroma tail, and the rest is averaged in linear XYZ.
import { deltaE00 } from "../difference";
import { xyzToLab } from "../spaces";
import type { Lab, PaletteEntry, Xyz } from "../types";
import { assignNearest, kmeans, seeded } from "./kmeans";
import { applyWindow, litWindow, meanXyz } from "./lit";
import { classify } from "./roles";

/** Calibrated samples of a region, one entry per pixel in each array. */
export interface Samples {
  n: number;
  X: Float64Array; Y: Float64Array; Z: Float64Array;
  L: Float64Array; a: Float64Array; b: Float64Array;
}

/** A colour of the region after exclusions: its robust mean, the samples averaged, and its area in samples. */
export interface ColourGroup {
  xyz: Xyz;
  lab: Lab;
  /** Samples averaged into the colour. */
  count: number;
  /** Samples counted as this colour's area (its own plus colour bleed at its edges). */
  area: number;
}

/** Squared-distance weights on L*, a*, b* for clustering: lightness at half weight, (½)² = 0.25 (as kL = 2 in textile practice). */
export const LAB_WEIGHTS: [number, number, number] = [0.25, 1, 1];
const MAX_K = 6;
/** Cluster centres closer than this (ΔE00 with kL = 2) are one colour [our choice]. */
const SEPARATION = 5;
/** A cluster below this share of the samples is not a colour of its own [our choice, as the palette's floor]. */
const MIN_CLUSTER_SHARE = 0.03;
const CLUSTER_SAMPLE = 1200;

/** Cluster the samples, drop shadow and glint pixels, and return each remaining colour's robust mean. */
export function groupColours(s: Samples, seed = 1): { groups: ColourGroup[]; shadow: number; glint: number } {
  const random = seeded(seed);
  const points = new Float64Array(s.n * 3);
  for (let i = 0; i < s.n; i++) {
    points[i * 3] = s.L[i];
    points[i * 3 + 1] = s.a[i];
    points[i * 3 + 2] = s.b[i];
  }
  const centres = chooseClusters(points, random);
  const assign = new Uint8Array(s.n);
  assignNearest(points, centres, LAB_WEIGHTS, assign);
  const k = centres.length / 3;
  // Members of each cluster as slices of one index array (a counting sort: no per-pixel allocation).
  const start = new Int32Array(k + 1);
  for (let i = 0; i < s.n; i++) start[assign[i] + 1]++;
  for (let j = 0; j < k; j++) start[j + 1] += start[j];
  const order = new Int32Array(s.n), fill = start.slice(0, k);
  for (let i = 0; i < s.n; i++) order[fill[assign[i]]++] = i;
  const members = Array.from({ length: k }, (_, j) => order.subarray(start[j], start[j + 1]));

  const summaries = members.map((m) => {
    const xyz = meanXyz(s, m);
    return { xyz, lab: xyzToLab(xyz), share: m.length / s.n };
  });
  const role = classify(summaries);
  let shadow = 0, glint = 0;
  const groups: (ColourGroup | null)[] = members.map(() => null);
  const windows = members.map((m, j) => (role[j].kind === "colour" ? litWindow(s, m) : null));
  members.forEach((m, j) => {
    const r = role[j];
    if (r.kind === "shadow") shadow += m.length;
    if (r.kind === "glint") glint += m.length;
    if (r.kind !== "colour") return;
    const kept = applyWindow(s, m, windows[j]!);
    shadow += kept.shadow;
    glint += kept.glint;
    if (kept.keep.length === 0) return;
    const xyz = meanXyz(s, kept.keep);
    groups[j] = { xyz, lab: xyzToLab(xyz), count: kept.keep.length, area: kept.keep.length };
  });
  // Bleed pixels inside their colour's lit band add to its area, not to its colour. Shares are of
  // lit fibre: shadow falls between strands whatever their colour, so it leaves shares unchanged.
  // Lit edge pixels between two colours are split between them.
  members.forEach((m, j) => {
    const r = role[j];
    if (r.kind === "bleed" && groups[r.of]) {
      const kept = applyWindow(s, m, windows[r.of]!);
      shadow += kept.shadow;
      glint += kept.glint;
      groups[r.of]!.area += kept.keep.length;
    } else if (r.kind === "mixed") {
      const a = groups[r.of], b = groups[r.and];
      if (a) a.area += m.length * r.share;
      if (b) b.area += m.length * (1 - r.share);
    }
  });
  return { groups: groups.filter((g): g is ColourGroup => g !== null), shadow, glint };
}

/** Merge groups closer than `mergeDe00` (ΔE00), drop those under `minShare`, and give shares of what is left. */
export function paletteOf(groups: readonly ColourGroup[], mergeDe00 = 5, minShare = 0.03): PaletteEntry[] {
  const g = groups.map((x) => ({ ...x, xyz: { ...x.xyz } }));
  for (;;) {
    let bi = -1, bj = -1, bd = mergeDe00;
    for (let i = 0; i < g.length; i++) {
      for (let j = i + 1; j < g.length; j++) {
        const d = deltaE00(g[i].lab, g[j].lab);
        if (d < bd) { bd = d; bi = i; bj = j; }
      }
    }
    if (bi < 0) break;
    const a = g[bi], b = g[bj], n = a.count + b.count;
    const xyz = {
      X: (a.xyz.X * a.count + b.xyz.X * b.count) / n,
      Y: (a.xyz.Y * a.count + b.xyz.Y * b.count) / n,
      Z: (a.xyz.Z * a.count + b.xyz.Z * b.count) / n,
    };
    g.splice(bj, 1);
    g[bi] = { xyz, lab: xyzToLab(xyz), count: n, area: a.area + b.area };
  }
  const total = g.reduce((t, x) => t + x.area, 0);
  const kept = g.filter((x) => x.area / total >= minShare);
  const keptTotal = kept.reduce((t, x) => t + x.area, 0);
  return kept.map((x) => ({ lab: x.lab, share: x.area / keptTotal })).sort((p, q) => q.share - p.share);
}

/** Largest k (≤ 6) whose clusters each hold ≥ 3 % of a subsample and lie ≥ SEPARATION apart (the search stops after two k in a row fail). */
function chooseClusters(points: Float64Array, random: () => number): Float64Array {
  const n = points.length / 3;
  let sub = points;
  if (n > CLUSTER_SAMPLE) {
    sub = new Float64Array(CLUSTER_SAMPLE * 3);
    for (let i = 0; i < CLUSTER_SAMPLE; i++) {
      const p = Math.floor(random() * n);
      sub.set(points.subarray(p * 3, p * 3 + 3), i * 3);
    }
  }
  const m = sub.length / 3;
  let chosen = kmeans(sub, 1, LAB_WEIGHTS, random, 1).centres;
  let misses = 0;
  for (let k = 2; k <= Math.min(MAX_K, m) && misses < 2; k++) {
    const run = kmeans(sub, k, LAB_WEIGHTS, random);
    misses++;
    if (Array.from(run.counts).some((c) => c / m < MIN_CLUSTER_SHARE)) continue;
    const labs = Array.from({ length: k }, (_, j) => ({ L: run.centres[j * 3], a: run.centres[j * 3 + 1], b: run.centres[j * 3 + 2] }));
    let apart = true;
    for (let i = 0; i < k && apart; i++) {
      for (let j = i + 1; j < k && apart; j++) if (deltaE00(labs[i], labs[j], { kL: 2 }) < SEPARATION) apart = false;
    }
    if (apart) { chosen = run.centres; misses = 0; }
  }
  return chosen;
}
