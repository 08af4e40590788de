// What each colour cluster of a yarn region is: a colour, a shadow, a glint, or colour bleed.
//
// Rules, applied in this order [our choices, tuned on the synthetic photos; see the swatch tests]:
// - shadow: a darker cluster (8–80 % of a lighter colour's or shadow's luminance) that, lifted to the lighter
//   one's luminance, is the same colour (ΔE00 < 6) or the same hue (±20°) and no more saturated
//   (for a near-neutral colour, C* < 20: within 8 of its chroma and ±30° of its hue).
//   A deeper dye at the same hue comes out more saturated when lifted, so tonal yarn is kept apart;
// - bleed: a smaller cluster with the lightness of a colour (±6 L*) and a chroma between it and
//   another colour's — JPEG stores colour at half resolution, so pixels at the edge of a speckle
//   keep their own lightness but borrow up to 60 % of a neighbour's chroma (within 3 a*b* units, or a tenth of
//   the way between the two, of that line; it replaces a shadow match that fits less closely);
// - glint: a small cluster (≤ 5 %) that is a darker colour plus near-white light (the residual's
//   chromaticity within 0.02 of D65 white, xy 0.3127, 0.3290);
// - mixed: a small cluster (< 8 %) whose mean is α·A + β·B of two colours (α, β ≥ 0; linear XYZ,
//   within 3 ΔE00): pixels straddling an edge, lit (α + β ≥ 0.8), their area split α : β; or, darker
//   and within 5 ΔE00, shadowed edges, left out as shadow;
// - deep gap: a small cluster (< 5 %) darker and duller than every colour is shadow too (so a
//   black speckle must cover 5 % to be kept when colours surround it).
// Bleed pixels count towards the area of the colour they belong to, never towards its colour.
import { deltaE00 } from "../difference";
import { labToLch, xyzToLab } from "../spaces";
import type { Lab, Xyz } from "../types";

export interface ClusterSummary {
  xyz: Xyz;
  lab: Lab;
  share: number;
}

/** A cluster's role; shadow, glint and bleed name the colour cluster whose area they belong to. */
export type Role =
  | { kind: "colour" }
  | { kind: "shadow"; of: number }
  | { kind: "glint"; of: number }
  | { kind: "bleed"; of: number }
  /** Edge pixels between two colours: `share` of the area goes to `of`, the rest to `and`. */
  | { kind: "mixed"; of: number; and: number; share: number };

/** Give every cluster a role (see the file comment for the rules). */
export function classify(c: readonly ClusterSummary[]): Role[] {
  const role: Role[] = c.map(() => ({ kind: "colour" }));
  const byY = c.map((_, i) => i).sort((p, q) => c[q].xyz.Y - c[p].xyz.Y);
  const shadowFit = c.map(() => Infinity);
  for (const d of byY) {
    let best = -1, bestScore = Infinity;
    for (const p of byY) {
      // A deeper shadow may match a lighter shadow better than the lit colour (the gap's gradient).
      const pr = role[p];
      if (p === d || (pr.kind !== "colour" && pr.kind !== "shadow")) continue;
      // The luminance floor holds against the lit colour too, so a chain of shadows cannot swallow black.
      if (pr.kind === "shadow" && c[d].xyz.Y / c[pr.of].xyz.Y < SHADOW_FLOOR) continue;
      const score = shadowScore(c[d], c[p]);
      if (score < bestScore) { best = pr.kind === "shadow" ? pr.of : p; bestScore = score; }
    }
    if (best >= 0) role[d] = { kind: "shadow", of: best };
    shadowFit[d] = bestScore;
  }
  const bySize = c.map((_, i) => i).sort((p, q) => c[p].share - c[q].share);
  for (const m of bySize) {
    // A speckle's rim with a light neighbour's chroma can also pass as that neighbour's shadow:
    // the story that fits closer wins (both measured in CIELAB units).
    if (role[m].kind !== "colour" && role[m].kind !== "shadow") continue;
    const bleed = bleedSource(c, role, m);
    if (bleed && bleed.dist < shadowFit[m]) role[m] = { kind: "bleed", of: bleed.into };
  }
  for (const g of byY) {
    if (role[g].kind !== "colour" || c[g].share > GLINT_MAX_SHARE) continue;
    for (const p of byY) {
      if (p === g || role[p].kind !== "colour" || c[p].xyz.Y >= c[g].xyz.Y || c[p].share < c[g].share) continue;
      const r = { X: c[g].xyz.X - c[p].xyz.X, Y: c[g].xyz.Y - c[p].xyz.Y, Z: c[g].xyz.Z - c[p].xyz.Z };
      const sum = r.X + r.Y + r.Z;
      if (r.Y > 0.02 && Math.hypot(r.X / sum - 0.3127, r.Y / sum - 0.329) < 0.02) { role[g] = { kind: "glint", of: p }; break; }
    }
  }
  for (const m of bySize) {
    if (role[m].kind !== "colour" || c[m].share >= MIXED_MAX_SHARE) continue;
    const mix = mixtureOf(c, role, m);
    if (mix) role[m] = mix.lit ? { kind: "mixed", of: mix.a, and: mix.b, share: mix.share } : { kind: "shadow", of: mix.a };
  }
  // The deepest gaps of a many-coloured yarn: a small cluster darker and duller than every colour.
  for (const m of bySize) {
    if (role[m].kind !== "colour" || c[m].share >= DEEP_GAP_MAX_SHARE) continue;
    const others = c.map((_, j) => j).filter((j) => j !== m && role[j].kind === "colour");
    if (others.length === 0) continue;
    const chroma = (j: number) => Math.hypot(c[j].lab.a, c[j].lab.b);
    if (others.every((j) => c[j].xyz.Y > c[m].xyz.Y && chroma(j) > chroma(m))) {
      role[m] = { kind: "shadow", of: others.reduce((p, q) => (c[q].share > c[p].share ? q : p)) };
    }
  }
  return role;
}

/** ΔE00 between d lifted to p's luminance and p when d passes as p's shadow; Infinity when it does not. */
function shadowScore(d: ClusterSummary, p: ClusterSummary): number {
  const ratio = d.xyz.Y / p.xyz.Y;
  if (!(ratio >= SHADOW_FLOOR && ratio <= 0.8)) return Infinity;
  const lifted = xyzToLab({ X: d.xyz.X / ratio, Y: p.xyz.Y, Z: d.xyz.Z / ratio });
  const de = deltaE00(lifted, p.lab);
  if (de < 6) return de;
  const l = labToLch(lifted), q = labToLch(p.lab);
  const dh = Math.abs(((l.h - q.h + 540) % 360) - 180);
  // Near-neutral colours: chroma is fragile (JPEG lends shadows their lit neighbours' chroma).
  if (q.C < 20) return l.C <= 1.1 * q.C + 8 && (l.C < 5 || q.C < 5 || dh <= 30) ? de : Infinity;
  return dh <= 20 && l.C >= 0.4 * q.C && l.C <= 1.1 * q.C + 2 ? de : Infinity;
}

/** The colour a cluster's pixels bled from (same lightness, chroma on the way to another colour) and how far off that line they lie. */
function bleedSource(c: readonly ClusterSummary[], role: readonly Role[], m: number): { into: number; dist: number } | null {
  let best = -1, bestDist = Infinity;
  for (let a = 0; a < c.length; a++) {
    if (a === m || role[a].kind !== "colour" || c[a].share <= c[m].share) continue;
    if (Math.abs(c[m].lab.L - c[a].lab.L) > 6) continue;
    for (let b = 0; b < c.length; b++) {
      if (b === a || b === m || role[b].kind !== "colour") continue;
      const ax = c[a].lab.a, ay = c[a].lab.b;
      const dx = c[b].lab.a - ax, dy = c[b].lab.b - ay;
      const len2 = dx * dx + dy * dy;
      if (len2 < 1) continue;
      const t = ((c[m].lab.a - ax) * dx + (c[m].lab.b - ay) * dy) / len2;
      if (t < 0.05 || t > 0.6) continue; // JPEG lends at most about half a neighbour's chroma
      const dist = Math.hypot(ax + t * dx - c[m].lab.a, ay + t * dy - c[m].lab.b);
      if (dist <= Math.max(3, 0.1 * Math.sqrt(len2)) && dist < bestDist) { best = a; bestDist = dist; }
    }
  }
  return best >= 0 ? { into: best, dist: bestDist } : null;
}

/** Darker than this share of a colour's luminance is a colour of its own (black speckles), not its shadow [our choice]. */
const SHADOW_FLOOR = 0.08;
/** Clusters under this share may be edge mixtures of two colours [our choice]. */
const MIXED_MAX_SHARE = 0.08;
/** Deep-gap clusters are small [our choice]. */
const DEEP_GAP_MAX_SHARE = 0.05;
/** Glint clusters are small [our choice]. */
const GLINT_MAX_SHARE = 0.05;

/** Best non-negative mixture α·A + β·B of two colour clusters explaining cluster m (within 3 ΔE00 lit, 5 shadowed), or null. */
function mixtureOf(
  c: readonly ClusterSummary[], role: readonly Role[], m: number,
): { a: number; b: number; share: number; lit: boolean } | null {
  const t = c[m].xyz;
  let best: { a: number; b: number; share: number; lit: boolean } | null = null;
  let bestDe = Infinity;
  for (let a = 0; a < c.length; a++) {
    if (a === m || role[a].kind !== "colour") continue;
    for (let b = a + 1; b < c.length; b++) {
      if (b === m || role[b].kind !== "colour") continue;
      const [alpha, beta] = nonNegativePair(c[a].xyz, c[b].xyz, t);
      if (alpha + beta === 0) continue;
      const fit = { X: alpha * c[a].xyz.X + beta * c[b].xyz.X, Y: alpha * c[a].xyz.Y + beta * c[b].xyz.Y, Z: alpha * c[a].xyz.Z + beta * c[b].xyz.Z };
      const de = deltaE00(xyzToLab(fit), c[m].lab);
      const lit = alpha + beta >= 0.8;
      // Shadowed edges are dark and noisy: they get a wider tolerance.
      if (de < (lit ? 3 : 5) && de < bestDe) {
        bestDe = de;
        best = { a, b, share: alpha / (alpha + beta), lit };
      }
    }
  }
  return best;
}

/** Least squares t ≈ α·u + β·v with α, β ≥ 0 (two unknowns: solve, then clamp to an edge if needed). */
function nonNegativePair(u: Xyz, v: Xyz, t: Xyz): [number, number] {
  const dot = (p: Xyz, q: Xyz) => p.X * q.X + p.Y * q.Y + p.Z * q.Z;
  const uu = dot(u, u), vv = dot(v, v), uv = dot(u, v), ut = dot(u, t), vt = dot(v, t);
  const det = uu * vv - uv * uv;
  if (det > 1e-12) {
    const alpha = (ut * vv - vt * uv) / det, beta = (vt * uu - ut * uv) / det;
    if (alpha >= 0 && beta >= 0) return [alpha, beta];
  }
  const onlyU = Math.max(ut / uu, 0), onlyV = Math.max(vt / vv, 0);
  const errU = dot(t, t) - 2 * onlyU * ut + onlyU * onlyU * uu;
  const errV = dot(t, t) - 2 * onlyV * vt + onlyV * onlyV * vv;
  return errU <= errV ? [onlyU, 0] : [0, onlyV];
}
