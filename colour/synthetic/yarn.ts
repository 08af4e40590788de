// Synthetic yarn swatches: strands with two plies, shadowed gaps, glints, and known colours.
//
// The ground truth is the colour of the lit fibre: across the lit part of a strand the shading
// factor is 1 + A·cos(…) over whole periods, times a fibre texture that averages 1, so the mean
// reflectance of the lit fibre is exactly the yarn's colour. The gaps between strands (shadow) and
// the glints on ply crests are what a reader has to leave out.
import { D65_WHITE, labToXyz, xyzToLab } from "../spaces";
import type { Lab, PaletteEntry, Xyz } from "../types";
import { hash2, type Random } from "./random";

export type YarnSpec =
  | { kind: "solid"; lab: Lab }
  /** A base colour with round speckles; `share` is the target area share of each speckle colour. */
  | { kind: "speckled"; base: Lab; speckles: { lab: Lab; share: number }[] }
  /** Colour sections running along the strands; shares of length sum to 1. */
  | { kind: "variegated"; sections: { lab: Lab; share: number }[] };

export interface YarnTexture {
  /** Strand width in pixels and direction of the strands (radians from the x axis). */
  period: number;
  angle: number;
  /** Share of each strand period that is shadowed gap. */
  gap: number;
  /** Amplitude of the ply shading across the lit strand. */
  ply: number;
  /** Amplitude of the per-pixel fibre texture (uniform, mean 1). */
  fibre: number;
  /** Share of ply-crest stretches that carry a glint, and the glint's peak added white. */
  glintRate: number;
  glintStrength: number;
}

/** Strands 28 px wide at 60° (a worsted strand in a 12 MP phone photo of a swatch, our estimate), 16 % gap, ±12 % ply shading, ±6 % fibre texture, sparse glints [our choices]. */
export const DEFAULT_TEXTURE: YarnTexture = {
  period: 28, angle: 1.05, gap: 0.16, ply: 0.12, fibre: 0.06, glintRate: 0.12, glintStrength: 0.5,
};

export interface YarnTruth {
  /** Area-weighted colour of the lit fibre (the linear mean of the palette, for multi-coloured yarn). */
  lab: Lab;
  /** Each colour and its exact share of the swatch's area. */
  palette: PaletteEntry[];
}

/** Render a swatch: scene XYZ (as seen under D65, Y of white = 1) per pixel, each pixel's colour (index into the truth's palette), and the ground truth. */
export function renderYarn(
  spec: YarnSpec, width: number, height: number, rand: Random, texture: YarnTexture = DEFAULT_TEXTURE, seed = 1,
): { xyz: Float32Array; labels: Uint8Array; truth: YarnTruth } {
  const colours = spec.kind === "solid" ? [spec.lab] : spec.kind === "speckled" ? [spec.base, ...spec.speckles.map((s) => s.lab)] : spec.sections.map((s) => s.lab);
  const colourXyz = colours.map((c) => labToXyz(c));
  const speckles = spec.kind === "speckled" ? speckleLabels(spec, width, height, rand, texture.period) : null;
  const labels = speckles ?? new Uint8Array(width * height);
  const counts = new Float64Array(colours.length);
  const xyz = new Float32Array(width * height * 3);
  const { period, angle, gap, ply, fibre, glintRate, glintStrength } = texture;
  const ca = Math.cos(angle), sa = Math.sin(angle);
  const twist = period * 3; // ply phase turns once every three strand widths along the strand
  const cycle = period * 24; // length of one round of variegated sections along a strand
  const cum = spec.kind === "variegated" ? cumulative(spec.sections.map((s) => s.share)) : [];

  for (let y = 0, o = 0; y < height; y++) {
    for (let x = 0; x < width; x++, o += 3) {
      const along = x * ca + y * sa;
      const q = (-x * sa + y * ca) / period;
      const strand = Math.floor(q);
      const t = q - strand;
      let label = 0;
      if (speckles) label = speckles[y * width + x];
      else if (spec.kind === "variegated") {
        const phase = hash2(strand, 7, seed);
        const f = along / cycle + phase;
        const pos = f - Math.floor(f);
        while (pos >= cum[label + 1]) label++;
        labels[y * width + x] = label;
      }
      counts[label]++;
      let s: number;
      let glint = 0;
      if (t < gap / 2 || t > 1 - gap / 2) {
        const d = 1 - Math.min(t, 1 - t) / (gap / 2); // 0 at the gap's edge, 1 in its middle
        s = 0.65 * (1 - d) + 0.1 * d;
      } else {
        const u = (t - gap / 2) / (1 - gap);
        const c = Math.cos(2 * Math.PI * (2 * u + along / twist));
        s = (1 + ply * c) * (1 + fibre * (2 * rand.next() - 1));
        if (c > 0.85 && hash2(strand, Math.floor(along / 5), seed + 1) < glintRate) {
          glint = (glintStrength * (c - 0.85)) / 0.15;
        }
      }
      const col = colourXyz[label];
      xyz[o] = s * col.X + glint * D65_WHITE.X;
      xyz[o + 1] = s * col.Y + glint;
      xyz[o + 2] = s * col.Z + glint * D65_WHITE.Z;
    }
  }
  const total = width * height;
  const palette = colours.map((lab, i) => ({ lab, share: counts[i] / total }));
  const mean: Xyz = { X: 0, Y: 0, Z: 0 };
  colourXyz.forEach((c, i) => {
    mean.X += c.X * palette[i].share;
    mean.Y += c.Y * palette[i].share;
    mean.Z += c.Z * palette[i].share;
  });
  return { xyz, labels, truth: { lab: spec.kind === "solid" ? spec.lab : xyzToLab(mean), palette } };
}

function cumulative(shares: number[]): number[] {
  const total = shares.reduce((s, v) => s + v, 0);
  const out = [0];
  for (const s of shares) out.push(out[out.length - 1] + s / total);
  out[out.length - 1] = 1 + 1e-9;
  return out;
}

/** Label map of a speckled swatch: 0 = base, i = speckle colour i, painted as round dots (radius 0.15–0.5 of a strand) until each reaches its share. */
function speckleLabels(
  spec: Extract<YarnSpec, { kind: "speckled" }>, width: number, height: number, rand: Random, period: number,
): Uint8Array {
  const labels = new Uint8Array(width * height);
  const area = width * height;
  spec.speckles.forEach((sp, k) => {
    let painted = 0;
    const goal = sp.share * area;
    while (painted < goal) {
      const r = period * (0.15 + rand.next() * 0.35);
      const cx = rand.next() * width, cy = rand.next() * height;
      for (let y = Math.max(0, Math.floor(cy - r)); y <= Math.min(height - 1, Math.ceil(cy + r)); y++) {
        for (let x = Math.max(0, Math.floor(cx - r)); x <= Math.min(width - 1, Math.ceil(cx + r)); x++) {
          const i = y * width + x;
          if (labels[i] === 0 && (x - cx) ** 2 + (y - cy) ** 2 <= r * r) {
            labels[i] = k + 1;
            if (++painted >= goal) return;
          }
        }
      }
    }
  });
  return labels;
}
