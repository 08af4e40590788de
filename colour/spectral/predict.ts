// Predicting a layer: K/S additivity per band over the base (Nobbs 1985; Berns 2000), partial
// coverage as an area mix of covered and uncovered fibre, and a gradient of depths along the skein.
// A prediction's `state` is the base of the next layer, so layers chain.
import type { Lab, PaletteEntry, Reflectance } from "../types";
import { BANDS } from "./cie-data";
import { cachedKs, cachedLabToReflectance, floorFor } from "./cache";
import { dyedReflectance, type SurfaceModel } from "./kubelka-munk";
import type { DyeProfile } from "./profile";
import { reflectanceToLab } from "./reflectance";

/** One area of the yarn: its curve, its share of the whole, and its gradient section if any. */
export interface SpectralPatch {
  /** Read-only: curves are shared between patches and caches. */
  reflectance: Reflectance;
  share: number;
  /** Section index (0-based) and section count of the last gradient that touched this area. */
  section?: number;
  sections?: number;
}

/** The spectral state of a yarn after some layers: the areas that make it up. */
export interface SpectralState {
  patches: SpectralPatch[];
}

/** A base is a measured colour, one reflectance curve, or an earlier prediction (or its state). */
export type LayerBase = Lab | Reflectance | SpectralState | Prediction;

/** One layer to apply. */
export interface Layer {
  dyes: { profile: DyeProfile; dosPct: number }[];
  /** Share of the dye that ends up on the fibre, 0–1 (1 = exhausted; default 1). */
  uptake?: number;
  /** Share of the fibre the dye reaches, 0–1, for speckling, painting, dry application (default 1). */
  coverage?: number;
  /**
   * What dosPct is measured on: "dyed" (default) — the fibre the dye reaches, at full section depth;
   * "skein" — the whole skein, so the dye is concentrated onto the covered area and spread over the
   * sections in proportion to their depths (the dye is conserved).
   */
  dosBasis?: "dyed" | "skein";
  /** Dip-dye / gradient: equal sections along the skein, each with a relative depth 0–1. */
  gradient?: { sections: number; depths: number[] };
}

/** A predicted result. */
export interface Prediction {
  /** Overall appearance: CIELAB of the area mix of the patches' reflectances. */
  lab: Lab;
  /** The area-mixed curve. Read-only: it may be shared with the state and the caches. */
  reflectance: Reflectance;
  /** Distinct areas (covered/uncovered, gradient sections) with shares summing to 1. */
  palette: PaletteEntry[];
  /** Colour of each gradient section, in order, when the layer has a gradient. */
  gradient?: Lab[];
  /** The base for the next layer. */
  state: SpectralState;
  /** Plain-words cautions (clamped colours, depths beyond the calibration). */
  notes: string[];
}

const NB = BANDS; // a plain local binding for the loops

const isState = (b: LayerBase): b is SpectralState => (b as SpectralState).patches !== undefined;
const isPrediction = (b: LayerBase): b is Prediction => (b as Prediction).state !== undefined;

function toState(base: LayerBase, surface: SurfaceModel, notes: string[]): SpectralState {
  if (base instanceof Float64Array) {
    if (base.length !== NB) throw new RangeError(`A reflectance curve has ${NB} bands (380–730 nm); this one has ${base.length}.`);
    return { patches: [{ reflectance: base, share: 1 }] };
  }
  if (isState(base)) return base;
  if (isPrediction(base)) return base.state;
  if (!(Number.isFinite(base.L) && Number.isFinite(base.a) && Number.isFinite(base.b))) {
    throw new RangeError("The base colour is not a CIELAB value (L*, a*, b* numbers).");
  }
  const est = cachedLabToReflectance(base, floorFor(surface));
  if (est.note) notes.push(est.note);
  return { patches: [{ reflectance: est.reflectance, share: 1 }] };
}

function fail(what: string): never {
  throw new RangeError(what);
}

/** Validates a layer and returns the surface model its profiles share. */
function check(layer: Layer): SurfaceModel {
  const u = layer.uptake ?? 1, cov = layer.coverage ?? 1;
  if (!(u >= 0 && u <= 1)) fail(`Uptake ${u} is not between 0 and 1.`);
  if (!(cov >= 0 && cov <= 1)) fail(`Coverage ${cov} is not between 0 and 1.`);
  const dyes = layer.dyes;
  for (let i = 0; i < dyes.length; i++) {
    if (!(Number.isFinite(dyes[i].dosPct) && dyes[i].dosPct >= 0)) fail(`Depth ${dyes[i].dosPct} % is not a depth of shade.`);
    if (dyes[i].profile.surface !== dyes[0].profile.surface) {
      fail("The layer mixes profiles learnt with and without the surface correction; refit them alike.");
    }
  }
  const g = layer.gradient;
  if (g) {
    if (!(Number.isInteger(g.sections) && g.sections >= 1)) fail(`A gradient needs a whole number of sections (got ${g.sections}).`);
    if (g.depths.length !== g.sections) fail(`A gradient of ${g.sections} sections needs ${g.sections} depths (got ${g.depths.length}).`);
    for (const d of g.depths) if (!(d >= 0 && d <= 1)) fail(`Section depth ${d} is not between 0 and 1.`);
  }
  return dyes.length ? dyes[0].profile.surface : "none";
}

/** Notes for dyes put on deeper than their calibration reached. */
function depthNotes(layer: Layer, scale: number, notes: string[]): void {
  const top = layer.gradient ? Math.max(...layer.gradient.depths) : 1;
  for (const d of layer.dyes) {
    const c = d.dosPct * (layer.uptake ?? 1) * scale * top;
    const cal = d.profile.calibratedUpTo;
    if (cal !== undefined && c > cal * 1.25) {
      notes.push(
        `${d.profile.dyeId} goes on at ${c.toFixed(2)} % here, deeper than any calibration dyeing ` +
          `(${cal.toFixed(2)} %): expect the prediction to be less sure.`,
      );
    }
  }
}

// Per-call scratch (predictions are synchronous, so one set of buffers serves every call).
let concBuf = new Float64Array(8);
let unitBuf: Float64Array[] = [];

/** Dyes one patch at a relative depth; pushes the covered and uncovered parts. */
function dyePatch(
  out: SpectralPatch[], layer: Layer, p: SpectralPatch, depth: number, share: number, scale: number,
  surface: SurfaceModel, section: number | undefined, sections: number | undefined,
): void {
  const coverage = layer.coverage ?? 1;
  if (coverage > 0 && share > 0) {
    const c = (layer.uptake ?? 1) * scale * depth;
    for (let i = 0; i < layer.dyes.length; i++) concBuf[i] = layer.dyes[i].dosPct * c;
    const rho = dyedReflectance(cachedKs(p.reflectance, surface), unitBuf, concBuf, surface);
    out.push({ reflectance: rho, share: share * coverage, section, sections });
  }
  if (coverage < 1 && share > 0) out.push({ reflectance: p.reflectance, share: share * (1 - coverage), section, sections });
}

/** Predict one layer over a base (K/S additivity, Nobbs 1985 / Berns 2000; area mix for coverage). */
export function predictLayer(base: LayerBase, layer: Layer): Prediction {
  const notes: string[] = [];
  const surface = check(layer);
  const state = toState(base, surface, notes);
  const nd = layer.dyes.length;
  if (concBuf.length < nd) concBuf = new Float64Array(nd);
  unitBuf.length = nd;
  for (let i = 0; i < nd; i++) unitBuf[i] = layer.dyes[i].profile.unitKs;
  const coverage = layer.coverage ?? 1;
  const g = layer.gradient;
  let meanDepth = 1;
  if (g) meanDepth = g.depths.reduce((s, v) => s + v, 0) / g.sections;
  // Whole-skein basis: the dye lands on coverage × (depth-weighted) fibre, so it is concentrated there.
  const scale = layer.dosBasis === "skein" ? (coverage > 0 && meanDepth > 0 ? 1 / (coverage * meanDepth) : 0) : 1;
  depthNotes(layer, scale, notes);

  const out: SpectralPatch[] = [];
  for (const p of state.patches) {
    if (!g) dyePatch(out, layer, p, 1, p.share, scale, surface, p.section, p.sections);
    else if (p.sections === g.sections && p.section !== undefined) {
      dyePatch(out, layer, p, g.depths[p.section], p.share, scale, surface, p.section, g.sections);
    } else {
      for (let s = 0; s < g.sections; s++) dyePatch(out, layer, p, g.depths[s], p.share / g.sections, scale, surface, s, g.sections);
    }
  }
  unitBuf.length = 0;
  return summarise(out, g?.sections, notes);
}

/** Overall curve, palette and section colours of a set of patches. */
function summarise(patches: SpectralPatch[], sections: number | undefined, notes: string[]): Prediction {
  if (patches.length === 1 && sections === undefined) {
    const only = patches[0];
    const lab = reflectanceToLab(only.reflectance);
    return { lab, reflectance: only.reflectance, palette: [{ lab, share: 1 }], state: { patches }, notes };
  }
  let reflectance: Reflectance;
  if (patches.length === 1) reflectance = patches[0].reflectance;
  else {
    reflectance = new Float64Array(NB);
    for (const p of patches) for (let i = 0; i < NB; i++) reflectance[i] += p.share * p.reflectance[i];
  }
  // One palette entry per distinct curve (uncovered parts of every section share the base's curve).
  const palette: PaletteEntry[] = [];
  const index = new Map<Reflectance, PaletteEntry>();
  for (const p of patches) {
    const seen = index.get(p.reflectance);
    if (seen) seen.share += p.share;
    else {
      const e = { lab: reflectanceToLab(p.reflectance), share: p.share };
      index.set(p.reflectance, e);
      palette.push(e);
    }
  }
  const lab = patches.length === 1 ? palette[0].lab : reflectanceToLab(reflectance);
  const pred: Prediction = { lab, reflectance, palette, state: { patches }, notes };
  if (sections !== undefined) {
    pred.gradient = [];
    for (let s = 0; s < sections; s++) {
      let only: SpectralPatch | undefined, count = 0, total = 0;
      for (const p of patches) if (p.section === s) { only = p; count++; total += p.share; }
      if (count === 1) { pred.gradient.push(index.get(only!.reflectance)!.lab); continue; }
      const mix = new Float64Array(NB);
      for (const p of patches) {
        if (p.section !== s) continue;
        for (let i = 0; i < NB; i++) mix[i] += p.share * p.reflectance[i];
      }
      if (total > 0) for (let i = 0; i < NB; i++) mix[i] /= total;
      pred.gradient.push(reflectanceToLab(mix));
    }
  }
  return pred;
}

/** Predict layers in order: each layer's prediction is the base of the next. Returns one per layer. */
export function predictLayers(base: LayerBase, layers: readonly Layer[]): Prediction[] {
  const out: Prediction[] = [];
  let current: LayerBase = base;
  for (const layer of layers) {
    const p = predictLayer(current, layer);
    out.push(p);
    current = p.state;
  }
  return out;
}
