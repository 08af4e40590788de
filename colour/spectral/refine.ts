// Colorimetric refinement of dye profiles. The NNLS fit works on reflectance curves guessed from
// colours (LHTSS), which are smooth but not the real curves, so K/S additivity holds for them only
// roughly. This step adjusts the unit K/S spectra so that the model reproduces the measured colours
// themselves, keeping each spectrum smooth and close to the NNLS start — a Levenberg–Marquardt fit
// (Levenberg 1944; Marquardt 1963) of CIELAB residuals, with k = exp(u) so that K/S stays positive.
import { Matrix, solve } from "ml-matrix";
import type { Lab } from "../types";
import { BANDS, SPECTRAL_WHITE, WEIGHT_X, WEIGHT_Y, WEIGHT_Z } from "./cie-data";
import { SAUNDERSON_DEFAULT, reflectanceFromKs, saundersonForward, type SurfaceModel } from "./kubelka-munk";

/** One dyeing as the refinement sees it: base K/S, effective depth per dye, measured colour. */
export interface RefineRow {
  baseKs: Float64Array;
  conc: number[];
  result: Lab;
}

/** Weights of the refinement's two priors. */
export interface RefineOptions {
  /** Weight of smoothness: squared steps of log K/S between neighbouring bands (default 2). */
  smoothness?: number;
  /** Weight of staying near the start: squared change of log K/S per band (default 0.05). */
  anchor?: number;
  iterations?: number;
}

const EPS = 216 / 24389, KAPPA = 24389 / 27; // CIE 15:2004
const f = (t: number) => (t > EPS ? Math.cbrt(t) : (KAPPA * t + 16) / 116);
const df = (t: number) => (t > EPS ? 1 / (3 * Math.cbrt(t * t)) : KAPPA / 116);

/** Model colour of one row and, when `jac` is given, d(L,a,b)/d(u) for every unknown (3 × n·36). */
function labOf(row: RefineRow, k: Float64Array[], surface: SurfaceModel, jac?: Float64Array): Lab {
  const n = k.length;
  const wx = WEIGHT_X, wy = WEIGHT_Y, wz = WEIGHT_Z, W = SPECTRAL_WHITE;
  let X = 0, Y = 0, Z = 0;
  const dR = new Float64Array(BANDS);
  for (let i = 0; i < BANDS; i++) {
    let x = row.baseKs[i];
    for (let d = 0; d < n; d++) x += row.conc[d] * k[d][i];
    let r = reflectanceFromKs(x);
    let g = x > 0 ? 1 - (x + 1) / Math.sqrt(x * x + 2 * x) : 0; // dR∞/d(K/S)
    if (surface === "saunderson") {
      const { k1, k2 } = SAUNDERSON_DEFAULT;
      g *= ((1 - k1) * (1 - k2)) / ((1 - k2 * r) * (1 - k2 * r));
      r = saundersonForward(r);
    }
    dR[i] = g;
    X += wx[i] * r; Y += wy[i] * r; Z += wz[i] * r;
  }
  const tx = X / W.X, ty = Y / W.Y, tz = Z / W.Z;
  const fx = f(tx), fy = f(ty), fz = f(tz);
  if (jac) {
    const gx = df(tx) / W.X, gy = df(ty) / W.Y, gz = df(tz) / W.Z;
    const m = n * BANDS;
    for (let d = 0; d < n; d++) {
      for (let i = 0; i < BANDS; i++) {
        const s = dR[i] * row.conc[d] * k[d][i]; // d r_i / d u_{d,i}
        const dfx = gx * wx[i] * s, dfy = gy * wy[i] * s, dfz = gz * wz[i] * s;
        const col = d * BANDS + i;
        jac[col] = 116 * dfy;
        jac[m + col] = 500 * (dfx - dfy);
        jac[2 * m + col] = 200 * (dfy - dfz);
      }
    }
  }
  return { L: 116 * fy - 16, a: 500 * (fx - fy), b: 200 * (fy - fz) };
}

/** Refine unit K/S spectra (one per dye, same order as `conc`) against measured colours; returns new spectra. */
export function refineProfiles(rows: readonly RefineRow[], start: readonly Float64Array[], surface: SurfaceModel, options: RefineOptions = {}): Float64Array[] {
  const n = start.length, m = n * BANDS;
  const smooth = options.smoothness ?? 2, anchor = options.anchor ?? 0.05;
  const floor = 1e-3;
  const u0 = start.map((s) => Float64Array.from(s, (v) => Math.log(Math.max(v, floor))));
  let u = u0.map((a) => Float64Array.from(a));
  const kOf = (uu: Float64Array[]) => uu.map((a) => a.map(Math.exp));
  const cost = (uu: Float64Array[]): number => {
    const k = kOf(uu);
    let c = 0;
    for (const row of rows) {
      const lab = labOf(row, k, surface);
      c += (lab.L - row.result.L) ** 2 + (lab.a - row.result.a) ** 2 + (lab.b - row.result.b) ** 2;
    }
    for (let d = 0; d < n; d++) {
      for (let i = 0; i < BANDS; i++) {
        c += anchor * (uu[d][i] - u0[d][i]) ** 2;
        if (i > 0) c += smooth * (uu[d][i] - uu[d][i - 1]) ** 2;
      }
    }
    return c;
  };
  let mu = 1e-2;
  let current = cost(u);
  const jac = new Float64Array(3 * m);
  for (let it = 0; it < (options.iterations ?? 40); it++) {
    const k = kOf(u);
    const H = new Float64Array(m * m); // upper triangle filled first, mirrored below
    const g = new Float64Array(m);
    for (const row of rows) {
      const lab = labOf(row, k, surface, jac);
      const res = [lab.L - row.result.L, lab.a - row.result.a, lab.b - row.result.b];
      for (let r = 0; r < 3; r++) {
        const o = r * m;
        for (let p = 0; p < m; p++) {
          const jp = jac[o + p];
          if (jp === 0) continue;
          g[p] += jp * res[r];
          const hp = p * m;
          for (let q = p; q < m; q++) H[hp + q] += jp * jac[o + q];
        }
      }
    }
    for (let d = 0; d < n; d++) {
      for (let i = 0; i < BANDS; i++) {
        const p = d * BANDS + i;
        g[p] += anchor * (u[d][i] - u0[d][i]);
        H[p * m + p] += anchor;
        if (i > 0) {
          const diff = smooth * (u[d][i] - u[d][i - 1]);
          g[p] += diff;
          g[p - 1] -= diff;
          H[p * m + p] += smooth;
          H[(p - 1) * m + p - 1] += smooth;
          H[(p - 1) * m + p] -= smooth;
        }
      }
    }
    for (let p = 0; p < m; p++) for (let q = 0; q < p; q++) H[p * m + q] = H[q * m + p];
    let improved = false;
    for (let tries = 0; tries < 8 && !improved; tries++) {
      const A = new Matrix(m, m);
      for (let p = 0; p < m; p++) {
        for (let q = 0; q < m; q++) A.set(p, q, H[p * m + q]);
        A.set(p, p, H[p * m + p] * (1 + mu) + 1e-9);
      }
      const step = solve(A, Matrix.columnVector(Array.from(g, (v) => -v))).getColumn(0);
      const trial = u.map((a, d) => a.map((v, i) => v + Math.max(-3, Math.min(3, step[d * BANDS + i]))));
      const c = cost(trial);
      if (c < current) {
        const gain = current - c;
        u = trial;
        current = c;
        mu = Math.max(mu / 3, 1e-7);
        improved = true;
        if (gain < 1e-10 * (1 + current)) return kOf(u);
      } else mu *= 4;
    }
    if (!improved) break;
  }
  return kOf(u);
}
