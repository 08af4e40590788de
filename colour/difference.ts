// Colour differences on CIELAB D65 values passed directly.
//
// Undertone works in CIELAB under D65. colorjs.io's difference functions adapt sRGB inputs to D50
// before differencing, so from sRGB they disagree with D65 Lab; these functions take Lab values and
// never convert. Hand-written for speed; culori (`differenceCiede2000`, `differenceCmc`, which use
// D65 Lab) is the oracle in the tests.
import type { Lab } from "./types";

/** kL for textiles: CIEDE2000 with kL = 2 is the textile alternative to CMC(2:1). */
export const TEXTILE_KL = 2;

const TWO_PI = 2 * Math.PI;
const DEG = Math.PI / 180;
const POW25_7 = 6103515625; // 25^7
const COS30 = Math.cos(30 * DEG), SIN30 = Math.sin(30 * DEG);
const COS6 = Math.cos(6 * DEG), SIN6 = Math.sin(6 * DEG);
const COS63 = Math.cos(63 * DEG), SIN63 = Math.sin(63 * DEG);

/** CIE76 ΔE*ab: Euclidean distance in CIELAB. */
export function deltaEab(lab1: Lab, lab2: Lab): number {
  const dL = lab1.L - lab2.L, da = lab1.a - lab2.a, db = lab1.b - lab2.b;
  return Math.sqrt(dL * dL + da * da + db * db);
}

/**
 * CIEDE2000 ΔE00 with parametric weights kL, kC, kH (default 1). Follows G. Sharma, W. Wu and
 * E. N. Dalal, "The CIEDE2000 color-difference formula: implementation notes…", Color Res. Appl.
 * 30(1):21–30, 2005, eqs. 1–22 (including the mean-hue rule for hues 180° apart). Symmetric.
 */
export function deltaE00(lab1: Lab, lab2: Lab, k?: { kL?: number; kC?: number; kH?: number }): number {
  const kL = k?.kL ?? 1, kC = k?.kC ?? 1, kH = k?.kH ?? 1;
  const L1 = lab1.L, a1 = lab1.a, b1 = lab1.b;
  const L2 = lab2.L, a2 = lab2.a, b2 = lab2.b;

  const Cab = (Math.sqrt(a1 * a1 + b1 * b1) + Math.sqrt(a2 * a2 + b2 * b2)) / 2;
  const Cab7 = pow7(Cab);
  const G = 0.5 * (1 - Math.sqrt(Cab7 / (Cab7 + POW25_7)));
  const a1p = (1 + G) * a1, a2p = (1 + G) * a2;
  const C1p = Math.sqrt(a1p * a1p + b1 * b1), C2p = Math.sqrt(a2p * a2p + b2 * b2);
  const h1p = hueRad(a1p, b1), h2p = hueRad(a2p, b2);

  const dLp = L2 - L1;
  const dCp = C2p - C1p;
  const CC = C1p * C2p;
  let dhp = 0;
  if (CC !== 0) {
    dhp = h2p - h1p;
    if (dhp > Math.PI) dhp -= TWO_PI;
    else if (dhp < -Math.PI) dhp += TWO_PI;
  }
  const dHp = 2 * Math.sqrt(CC) * Math.sin(dhp / 2);

  const Lbp = (L1 + L2) / 2;
  const Cbp = (C1p + C2p) / 2;
  let hbp = h1p + h2p;
  if (CC !== 0) {
    if (Math.abs(h1p - h2p) <= Math.PI) hbp /= 2;
    else hbp = hbp < TWO_PI ? (hbp + TWO_PI) / 2 : (hbp - TWO_PI) / 2;
  }

  // T = 1 − 0.17 cos(h̄′ − 30°) + 0.24 cos 2h̄′ + 0.32 cos(3h̄′ + 6°) − 0.20 cos(4h̄′ − 63°), with the
  // multiple angles from one cos and one sin (double- and triple-angle identities) for speed.
  const c1 = Math.cos(hbp), s1 = Math.sin(hbp);
  const c2 = 2 * c1 * c1 - 1, s2 = 2 * s1 * c1;
  const c3 = c1 * (4 * c1 * c1 - 3), s3 = s1 * (3 - 4 * s1 * s1);
  const c4 = 2 * c2 * c2 - 1, s4 = 2 * s2 * c2;
  const T =
    1 -
    0.17 * (c1 * COS30 + s1 * SIN30) +
    0.24 * c2 +
    0.32 * (c3 * COS6 - s3 * SIN6) -
    0.2 * (c4 * COS63 + s4 * SIN63);
  const hDeg = hbp / DEG;
  const dTheta = 30 * DEG * Math.exp(-((hDeg - 275) / 25) * ((hDeg - 275) / 25));
  const Cbp7 = pow7(Cbp);
  const RC = 2 * Math.sqrt(Cbp7 / (Cbp7 + POW25_7));
  const L50 = (Lbp - 50) * (Lbp - 50);
  const SL = 1 + (0.015 * L50) / Math.sqrt(20 + L50);
  const SC = 1 + 0.045 * Cbp;
  const SH = 1 + 0.015 * Cbp * T;
  const RT = -Math.sin(2 * dTheta) * RC;

  const l = dLp / (kL * SL), c = dCp / (kC * SC), h = dHp / (kH * SH);
  return Math.sqrt(l * l + c * c + h * h + RT * c * h);
}

/**
 * CMC(l:c) colour difference of `sample` from `standard` (F. J. J. Clarke, R. McDonald and B. Rigg,
 * J. Soc. Dyers Colourists 100, 1984; ISO 105-J03). Not symmetric: the weights come from the
 * standard. Defaults l = 2, c = 1, the textile acceptability setting.
 */
export function deltaECMC(standard: Lab, sample: Lab, l = 2, c = 1): number {
  const L1 = standard.L, a1 = standard.a, b1 = standard.b;
  const C1 = Math.sqrt(a1 * a1 + b1 * b1);
  const C2 = Math.sqrt(sample.a * sample.a + sample.b * sample.b);
  const dL = L1 - sample.L, dC = C1 - C2;
  const da = a1 - sample.a, db = b1 - sample.b;
  const dH2 = Math.max(0, da * da + db * db - dC * dC);

  const h1 = hueRad(a1, b1);
  const T =
    h1 >= 164 * DEG && h1 <= 345 * DEG
      ? 0.56 + Math.abs(0.2 * Math.cos(h1 + 168 * DEG))
      : 0.36 + Math.abs(0.4 * Math.cos(h1 + 35 * DEG));
  const C14 = C1 * C1 * C1 * C1;
  const F = Math.sqrt(C14 / (C14 + 1900));
  const SL = L1 < 16 ? 0.511 : (0.040975 * L1) / (1 + 0.01765 * L1);
  const SC = (0.0638 * C1) / (1 + 0.0131 * C1) + 0.638;
  const SH = SC * (F * T + 1 - F);

  const tl = dL / (l * SL), tc = dC / (c * SC);
  return Math.sqrt(tl * tl + tc * tc + dH2 / (SH * SH));
}

/** Hue angle in radians, 0–2π; 0 for a neutral. */
function hueRad(a: number, b: number): number {
  if (a === 0 && b === 0) return 0;
  const h = Math.atan2(b, a);
  return h < 0 ? h + TWO_PI : h;
}

function pow7(x: number): number {
  const x2 = x * x;
  return x2 * x2 * x2 * x;
}
