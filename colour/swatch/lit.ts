// The lit level of a colour cluster: which of its pixels are lit fibre, shadow, or glint.
import type { Xyz } from "../types";
import type { Samples } from "./palette";

/** Half-width of the mean-shift window in ln Y (±28 % in luminance) [our choice]. */
const SHIFT_WINDOW = 0.25;

export interface LitWindow {
  /** Centre of the lit bump, ln Y. */
  mu: number;
  /** Half-width of the kept band, ln Y. */
  half: number;
  /** Median chroma C*ab of the cluster (glints are not more saturated than it). */
  medC: number;
}

/**
 * Find a cluster's lit band: the centre of its lit bump in log luminance by mean shift (a ±0.25
 * window, started at the 70th percentile so that shadow cannot pull it down), and a half-width of
 * 1.25 × the 90th percentile of the deviations above the centre (the bright side, where shadow does
 * not reach) [our choice; symmetric, so a symmetric lit spread keeps its mean].
 */
export function litWindow(s: Samples, m: readonly number[]): LitWindow {
  const v = m.map((i) => Math.log(Math.max(s.Y[i], 1e-6)));
  let mu = quantile(v, 0.7);
  for (let iter = 0; iter < 30; iter++) {
    let sum = 0, n = 0;
    for (const x of v) if (Math.abs(x - mu) <= SHIFT_WINDOW) { sum += x; n++; }
    const next = n ? sum / n : mu;
    if (Math.abs(next - mu) < 1e-5) break;
    mu = next;
  }
  const up = v.filter((x) => x > mu).map((x) => x - mu);
  return { mu, half: Math.max(1.25 * quantile(up, 0.9), 0.04), medC: quantile(m.map((i) => Math.hypot(s.a[i], s.b[i])), 0.5) };
}

/** Split pixels by a lit band: below it shadow, above it and no more saturated than usual glint, else kept. */
export function applyWindow(s: Samples, m: readonly number[], w: LitWindow): { keep: number[]; shadow: number; glint: number } {
  const keep: number[] = [];
  let shadow = 0, glint = 0;
  for (const i of m) {
    const v = Math.log(Math.max(s.Y[i], 1e-6));
    if (v < w.mu - w.half) shadow++;
    else if (v > w.mu + w.half && Math.hypot(s.a[i], s.b[i]) <= w.medC + 3) glint++;
    else keep.push(i);
  }
  return { keep, shadow, glint };
}

/** Plain mean XYZ of the listed samples. */
export function meanXyz(s: Samples, m: readonly number[]): Xyz {
  let X = 0, Y = 0, Z = 0;
  for (const i of m) { X += s.X[i]; Y += s.Y[i]; Z += s.Z[i]; }
  const n = Math.max(m.length, 1);
  return { X: X / n, Y: Y / n, Z: Z / n };
}

/** Linear-interpolated quantile (0 for an empty list). */
export function quantile(v: readonly number[], q: number): number {
  if (v.length === 0) return 0;
  const s = Float64Array.from(v).sort();
  const pos = q * (s.length - 1), i = Math.floor(pos);
  return i + 1 < s.length ? s[i] + (pos - i) * (s[i + 1] - s[i]) : s[i];
}
