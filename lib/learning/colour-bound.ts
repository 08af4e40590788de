// A lower bound on CIEDE2000 from the CIELAB distance, used to stop a nearest-colour search early
// without missing a match. Derivation (Sharma, Wu & Dalal 2005, eqs. 1–22, kL = kC = kH = 1):
// - a' = (1 + G)·a with the same G ≤ 0.5 for both colours, so the primed distance ΔE' ≥ ΔE*ab,
//   and ΔL'² + ΔC'² + ΔH'² = ΔE'² exactly (ΔH' = 2√(C1'C2')·sin(Δh'/2)).
// - |RT| = |sin(2Δθ)|·RC ≤ sin 60° · 2 ≈ 1.732, and x² + y² + RT·x·y ≥ (1 − |RT|/2)(x² + y²).
// - SL ≤ 1.75, SH ≤ 1 + 0.015·1.93·C̄' ≤ SC = 1 + 0.045·C̄', and C̄' ≤ C1' + ΔE'/2 ≤ 1.5·C1 + ΔE'/2.
// Hence ΔE00 ≥ √(1 − 0.866)·ΔE' / (1 + 0.045·(1.5·C1 + ΔE'/2)), increasing in ΔE'.

const K = Math.sqrt(1 - Math.sin(Math.PI / 3));

/** The smallest ΔE00 any colour at CIELAB distance ≥ r from a colour of chroma c1 can have. */
export function de00LowerBound(r: number, c1: number): number {
  return (K * r) / (1 + 0.045 * (1.5 * c1 + r / 2));
}

/** The CIELAB radius beyond which every colour is more than `d` ΔE00 away (Infinity when no radius is). */
export function radiusFor(d: number, c1: number): number {
  const denom = K - 0.0225 * d;
  return denom > 0 ? (d * (1 + 0.0675 * c1)) / denom : Infinity;
}
