// Caches for the hot path: LHTSS of repeated Lab values and K/S spectra of repeated curves.
// A studio predicts many layers over the same few bases, and LHTSS (a Newton solve) costs ~0.2 ms
// where the rest of a prediction costs microseconds.
import type { Lab, Reflectance } from "../types";
import { SAUNDERSON_DEFAULT, ksSpectrum, type SurfaceModel } from "./kubelka-munk";
import { labToReflectance, type ReflectanceEstimate } from "./reflectance";

const LAB_CACHE_SIZE = 1024;
const labCache = new Map<string, ReflectanceEstimate>();
const RECENT = 16;
const recent: ({ L: number; a: number; b: number; floor: number; est: ReflectanceEstimate } | undefined)[] = new Array(RECENT);
let recentNext = 0;

function remember(lab: Lab, floor: number, est: ReflectanceEstimate): void {
  recent[recentNext] = { L: lab.L, a: lab.a, b: lab.b, floor, est };
  recentNext = (recentNext + 1) % RECENT;
}

/**
 * `labToReflectance` remembered for up to 1024 distinct Lab values (the oldest entry is dropped).
 * The returned curve is shared: treat it as read-only.
 */
export function cachedLabToReflectance(lab: Lab, floor = 0): ReflectanceEstimate {
  // A short ring of recent values compared as numbers first: no string building on the hot path.
  for (let i = 0; i < RECENT; i++) {
    const r = recent[i];
    if (r && r.L === lab.L && r.a === lab.a && r.b === lab.b && r.floor === floor) return r.est;
  }
  const key = `${lab.L}|${lab.a}|${lab.b}|${floor}`;
  const hit = labCache.get(key);
  if (hit) {
    remember(lab, floor, hit);
    return hit;
  }
  const est = labToReflectance(lab, { floor });
  Object.freeze(est);
  labCache.set(key, est);
  if (labCache.size > LAB_CACHE_SIZE) labCache.delete(labCache.keys().next().value as string);
  remember(lab, floor, est);
  return est;
}

/** Lowest reflectance of curves estimated for a surface model: k1 under Saunderson's correction. */
export const floorFor = (surface: SurfaceModel): number => (surface === "saunderson" ? SAUNDERSON_DEFAULT.k1 : 0);

const ksCache: Record<SurfaceModel, WeakMap<Reflectance, Float64Array>> = {
  none: new WeakMap(),
  saunderson: new WeakMap(),
};

/** K/S spectrum of a curve, remembered per curve object (the curve must not be changed afterwards). */
export function cachedKs(rho: Reflectance, surface: SurfaceModel): Float64Array {
  const map = ksCache[surface];
  let ks = map.get(rho);
  if (!ks) {
    ks = ksSpectrum(rho, surface);
    map.set(rho, ks);
  }
  return ks;
}
