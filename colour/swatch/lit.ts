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
export function litWindow(s: Samples, m: ArrayLike<number>): LitWindow {
  const n = m.length;
  const v = new Float64Array(n);
  const C = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    v[j] = Math.log(Math.max(s.Y[m[j]], 1e-6));
    C[j] = Math.hypot(s.a[m[j]], s.b[m[j]]);
  }
  v.sort();
  C.sort();
  // Prefix sums make each mean-shift step two binary searches.
  const prefix = new Float64Array(n + 1);
  for (let j = 0; j < n; j++) prefix[j + 1] = prefix[j] + v[j];
  let mu = sortedQuantile(v, 0, n, 0.7);
  for (let iter = 0; iter < 30; iter++) {
    const lo = lowerBound(v, mu - SHIFT_WINDOW), hi = upperBound(v, mu + SHIFT_WINDOW);
    const next = hi > lo ? (prefix[hi] - prefix[lo]) / (hi - lo) : mu;
    if (Math.abs(next - mu) < 1e-5) break;
    mu = next;
  }
  const above = upperBound(v, mu);
  const up90 = above < n ? sortedQuantile(v, above, n, 0.9) - mu : 0;
  return { mu, half: Math.max(1.25 * up90, 0.04), medC: sortedQuantile(C, 0, n, 0.5) };
}

/** Split pixels by a lit band: below it shadow, above it and no more saturated than usual glint, else kept. */
export function applyWindow(s: Samples, m: ArrayLike<number>, w: LitWindow): { keep: Int32Array; shadow: number; glint: number } {
  const keep = new Int32Array(m.length);
  let kept = 0, shadow = 0, glint = 0;
  for (let j = 0; j < m.length; j++) {
    const i = m[j];
    const v = Math.log(Math.max(s.Y[i], 1e-6));
    if (v < w.mu - w.half) shadow++;
    else if (v > w.mu + w.half && Math.hypot(s.a[i], s.b[i]) <= w.medC + 3) glint++;
    else keep[kept++] = i;
  }
  return { keep: keep.subarray(0, kept), shadow, glint };
}

/** Plain mean XYZ of the listed samples. */
export function meanXyz(s: Samples, m: ArrayLike<number>): Xyz {
  let X = 0, Y = 0, Z = 0;
  for (let j = 0; j < m.length; j++) { const i = m[j]; X += s.X[i]; Y += s.Y[i]; Z += s.Z[i]; }
  const n = Math.max(m.length, 1);
  return { X: X / n, Y: Y / n, Z: Z / n };
}

/** Linear-interpolated quantile of the sorted slice v[from, to). */
function sortedQuantile(v: Float64Array, from: number, to: number, q: number): number {
  if (to <= from) return 0;
  const pos = from + q * (to - from - 1), i = Math.floor(pos);
  return i + 1 < to ? v[i] + (pos - i) * (v[i + 1] - v[i]) : v[i];
}

/** First index whose value is ≥ x (v sorted). */
function lowerBound(v: Float64Array, x: number): number {
  let lo = 0, hi = v.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (v[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index whose value is > x (v sorted). */
function upperBound(v: Float64Array, x: number): number {
  let lo = 0, hi = v.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (v[mid] <= x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
