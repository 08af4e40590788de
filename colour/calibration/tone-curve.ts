// Per-channel tone curve: camera 8-bit values → linear light, fitted from the card's neutral patches.
//
// Phones do not apply the exact sRGB curve (they add contrast, shoulders and their own gamma), so the
// curve is learnt from the greys: in log–log space (log code value against log of the grey's known
// luminance Y) a power law is a straight line. With two greys we fit that line (a gamma and a gain
// per channel); with three or more we join the greys with straight segments in log–log space — a
// monotone, piecewise power law that is exact for any power-law camera — and extend both ends with
// the fitted gamma. With one grey (or greys too alike in Y) nothing can be fitted and the sRGB
// curve (IEC 61966-2-1) is assumed. The curve maps each grey to its known Y in every channel, so it
// also white-balances: a neutral comes out with equal linear channels.
import { srgbDecode } from "../spaces";
import type { Rgb } from "../types";
import { CalibrationError } from "./errors";

/** A neutral patch as seen by the camera: mean 8-bit RGB (floats) and its known luminance Y (white = 1). */
export interface NeutralSample {
  rgb: Rgb;
  Y: number;
  /** 0-based index of the patch on the card, for messages. */
  index?: number;
}

export type ToneCurveKind = "srgb" | "gamma" | "piecewise";

/** Everything needed to rebuild a tone curve (plain numbers, storable as JSON). */
export interface ToneCurveParams {
  kind: ToneCurveKind;
  /** Per-channel slope in log–log space (the camera's encoding gamma; 2.4-ish for sRGB). */
  gamma: [number, number, number];
  /** Per-channel log gain: ln(linear) = gain + gamma · ln(code / 255) on the fitted line. */
  gain: [number, number, number];
  /** Per-channel nodes (ln(code / 255), ln Y) of the piecewise curve; empty unless kind is "piecewise". */
  nodes: { x: number[]; y: number[] }[];
}

/** A fitted tone curve with its evaluators. */
export interface ToneCurve extends ToneCurveParams {
  /** Camera 8-bit RGB (floats allowed) → linear light (a grey of luminance Y gives Y, Y, Y). */
  toLinear(rgb: Rgb): Rgb;
  /** Linear value of every integer code 0–255, per channel, for bulk reading. */
  lut: [Float64Array, Float64Array, Float64Array];
}

/** Greys closer than this ratio in Y are treated as one grey. */
const SAME_GREY = 1.05;
/** Below this spread of Y (brightest / darkest grey) no curve can be fitted. */
const MIN_SPREAD = 1.5;
/** Lowest code used inside a logarithm. */
const FLOOR = 0.25;

/** Fit a per-channel tone curve from neutral patches (see the file comment for the method). */
export function fitToneCurve(neutrals: readonly NeutralSample[]): ToneCurve {
  if (neutrals.length === 0) {
    throw new CalibrationError("no-neutral", "No neutral (grey) patch: the tone curve is fitted from the card's greys.");
  }
  const greys = mergeAlike([...neutrals].sort((p, q) => p.Y - q.Y));
  const spread = greys[greys.length - 1].Y / greys[0].Y;
  if (greys.length < 2 || spread < MIN_SPREAD) return toneCurveFromParams(SRGB_PARAMS);

  const gamma: [number, number, number] = [0, 0, 0];
  const gain: [number, number, number] = [0, 0, 0];
  const nodes: { x: number[]; y: number[] }[] = [];
  for (let c = 0; c < 3; c++) {
    const x = greys.map((g) => Math.log(Math.max(g.rgb[c], FLOOR) / 255));
    const y = greys.map((g) => Math.log(g.Y));
    for (let i = 1; i < x.length; i++) {
      if (!(x[i] > x[i - 1])) {
        const a = greys[i - 1].index, b = greys[i].index;
        const which = a !== undefined && b !== undefined ? ` (patches #${a + 1} and #${b + 1})` : "";
        throw new CalibrationError(
          "out-of-order",
          `The grey patches are not in order of lightness in the ${"RGB"[c]} channel${which}: ` +
            "check that the card's corners were marked in the right order.",
          a !== undefined && b !== undefined ? [a, b] : [],
        );
      }
    }
    const [slope, intercept] = lineFit(x, y);
    gamma[c] = slope;
    gain[c] = intercept;
    nodes.push(greys.length >= 3 ? { x, y } : { x: [], y: [] });
  }
  return toneCurveFromParams({ kind: greys.length >= 3 ? "piecewise" : "gamma", gamma, gain, nodes });
}

/** The sRGB decoding curve (IEC 61966-2-1), used when the greys cannot support a fit. */
export const SRGB_PARAMS: ToneCurveParams = Object.freeze({
  kind: "srgb" as const,
  gamma: [2.4, 2.4, 2.4] as [number, number, number],
  gain: [0, 0, 0] as [number, number, number],
  nodes: [],
});

/** Rebuild a tone curve (evaluators and lookup table) from its stored parameters. */
export function toneCurveFromParams(params: ToneCurveParams): ToneCurve {
  const channel = (c: number) => (v: number): number => {
    if (params.kind === "srgb") return srgbDecode(Math.max(v, 0) / 255);
    const x = Math.log(Math.max(v, FLOOR) / 255);
    if (params.kind === "gamma") return Math.exp(params.gain[c] + params.gamma[c] * x);
    return Math.exp(piecewise(params.nodes[c], params.gamma[c], x));
  };
  const fns = [channel(0), channel(1), channel(2)];
  let lut: ToneCurve["lut"] | null = null; // built on first use: fits inside leave-one-out never need it
  return {
    ...params,
    toLinear: (rgb: Rgb): Rgb => [fns[0](rgb[0]), fns[1](rgb[1]), fns[2](rgb[2])],
    get lut() {
      if (!lut) {
        lut = [new Float64Array(256), new Float64Array(256), new Float64Array(256)];
        for (let c = 0; c < 3; c++) for (let i = 0; i < 256; i++) lut[c][i] = fns[c](i);
      }
      return lut;
    },
  };
}

/** Straight segments between nodes, extended past both ends with `slope`. */
function piecewise(n: { x: number[]; y: number[] }, slope: number, x: number): number {
  const last = n.x.length - 1;
  if (x <= n.x[0]) return n.y[0] + slope * (x - n.x[0]);
  if (x >= n.x[last]) return n.y[last] + slope * (x - n.x[last]);
  let i = 1;
  while (n.x[i] < x) i++;
  const t = (x - n.x[i - 1]) / (n.x[i] - n.x[i - 1]);
  return n.y[i - 1] + t * (n.y[i] - n.y[i - 1]);
}

/** Ordinary least-squares line y = slope · x + intercept. */
function lineFit(x: number[], y: number[]): [number, number] {
  const n = x.length;
  const mx = x.reduce((s, v) => s + v, 0) / n;
  const my = y.reduce((s, v) => s + v, 0) / n;
  let sxy = 0, sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (x[i] - mx) * (y[i] - my);
    sxx += (x[i] - mx) * (x[i] - mx);
  }
  const slope = sxy / sxx;
  return [slope, my - slope * mx];
}

/** Average greys whose Y are within SAME_GREY of each other (input sorted by Y). */
function mergeAlike(sorted: NeutralSample[]): NeutralSample[] {
  const out: { rgb: number[]; Y: number; n: number; index?: number }[] = [];
  for (const g of sorted) {
    const prev = out[out.length - 1];
    if (prev && g.Y / (prev.Y / prev.n) < SAME_GREY) {
      prev.Y += g.Y;
      for (let c = 0; c < 3; c++) prev.rgb[c] += g.rgb[c];
      prev.n++;
    } else out.push({ rgb: [...g.rgb], Y: g.Y, n: 1, index: g.index });
  }
  return out.map((g) => ({
    rgb: [g.rgb[0] / g.n, g.rgb[1] / g.n, g.rgb[2] / g.n] as Rgb,
    Y: g.Y / g.n,
    index: g.index,
  }));
}
