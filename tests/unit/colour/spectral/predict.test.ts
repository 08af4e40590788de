import { beforeAll, describe, expect, it } from "vitest";
import { deltaE00 } from "@/colour/difference";
import { fitDyeProfiles, type DyeProfile } from "@/colour/spectral/profile";
import { predictLayer, predictLayers, type Layer } from "@/colour/spectral/predict";
import { reflectanceToLab } from "@/colour/spectral/reflectance";
import { ksFromReflectance } from "@/colour/spectral/kubelka-munk";
import { SYNTHETIC_BASES, syntheticCalibrationSet } from "@/colour/spectral/synthetic-dyeings";

let P: Record<string, DyeProfile>;
const base = reflectanceToLab(SYNTHETIC_BASES.white);

beforeAll(() => {
  const fit = fitDyeProfiles(syntheticCalibrationSet());
  if (!fit.ok) throw new Error(fit.message);
  P = Object.fromEntries(fit.profiles.map((p) => [p.dyeId, p]));
});

const teal = (extra: Partial<Layer> = {}): Layer => ({
  dyes: [{ profile: P.turquoise, dosPct: 1 }, { profile: P["golden-yellow"], dosPct: 0.4 }],
  ...extra,
});
const sumShares = (p: { palette: { share: number }[] }) => p.palette.reduce((s, e) => s + e.share, 0);

describe("one layer", () => {
  it("K/S of the result = K/S of the base + Σ c·k per band (Nobbs 1985; Berns 2000)", () => {
    const a = predictLayer(SYNTHETIC_BASES.white, teal({ uptake: 0.8 }));
    for (const i of [3, 20, 30]) {
      const expected = ksFromReflectance(SYNTHETIC_BASES.white[i]) + 0.8 * (P.turquoise.unitKs[i] + 0.4 * P["golden-yellow"].unitKs[i]);
      expect(ksFromReflectance(a.reflectance[i])).toBeCloseTo(expected, 9);
    }
  });
  it("no dye, or depth 0, leaves the base as it was", () => {
    const p = predictLayer(base, { dyes: [{ profile: P.magenta, dosPct: 0 }] });
    expect(deltaE00(p.lab, base)).toBeLessThan(1e-6);
    expect(deltaE00(predictLayer(base, { dyes: [] }).lab, base)).toBeLessThan(1e-6);
  });
  it("deeper is darker, and uptake 0.5 of 2 % equals 1 % fully taken up", () => {
    const L = [0.25, 0.5, 1, 2, 4].map((d) => predictLayer(base, { dyes: [{ profile: P.black, dosPct: d }] }).lab.L);
    for (let i = 1; i < L.length; i++) expect(L[i]).toBeLessThan(L[i - 1]);
    const half = predictLayer(base, { dyes: [{ profile: P.magenta, dosPct: 2 }], uptake: 0.5 });
    const one = predictLayer(base, { dyes: [{ profile: P.magenta, dosPct: 1 }] });
    expect(deltaE00(half.lab, one.lab)).toBeLessThan(1e-9);
  });
  it("notes a depth far beyond the calibration (3 % was the deepest)", () => {
    expect(predictLayer(base, { dyes: [{ profile: P.magenta, dosPct: 8 }] }).notes.join(" ")).toMatch(/deeper than any calibration/);
    expect(predictLayer(base, { dyes: [{ profile: P.magenta, dosPct: 2 }] }).notes).toEqual([]);
  });
  it("refuses nonsense with plain words", () => {
    expect(() => predictLayer(base, teal({ coverage: 1.2 }))).toThrow(/Coverage/);
    expect(() => predictLayer(base, teal({ uptake: -0.1 }))).toThrow(/Uptake/);
    expect(() => predictLayer(base, teal({ gradient: { sections: 3, depths: [1, 0.5] } }))).toThrow(/needs 3 depths/);
    expect(() => predictLayer(base, { dyes: [{ profile: P.black, dosPct: -1 }] })).toThrow(/not a depth/);
    const saund = { ...P.black, surface: "saunderson" as const };
    expect(() => predictLayer(base, { dyes: [{ profile: P.black, dosPct: 1 }, { profile: saund, dosPct: 1 }] })).toThrow(/surface correction/);
  });
});

describe("coverage (speckling, painting, dry application)", () => {
  it("coverage 0 → base unchanged; coverage 1 → the full layer", () => {
    const none = predictLayer(base, teal({ coverage: 0 }));
    expect(deltaE00(none.lab, base)).toBeLessThan(1e-6);
    expect(none.palette).toHaveLength(1);
    expect(none.palette[0].share).toBe(1);
    const full = predictLayer(base, teal({ coverage: 1 }));
    const plain = predictLayer(base, teal());
    expect(deltaE00(full.lab, plain.lab)).toBe(0);
    expect(full.palette).toHaveLength(1);
  });
  it("partial coverage: two areas with shares summing to 1, overall = area mix of reflectances", () => {
    const p = predictLayer(base, teal({ coverage: 0.3 }));
    expect(p.palette).toHaveLength(2);
    expect(sumShares(p)).toBeCloseTo(1, 12);
    expect(p.palette.map((e) => e.share)).toEqual([0.3, 0.7]);
    const dyed = predictLayer(base, teal()).reflectance;
    const baseRho = predictLayer(base, teal({ coverage: 0 })).reflectance;
    p.reflectance.forEach((v, i) => expect(v).toBeCloseTo(0.3 * dyed[i] + 0.7 * baseRho[i], 12));
    expect(deltaE00(p.palette[0].lab, reflectanceToLab(dyed))).toBeLessThan(1e-9);
  });
  it("whole-skein basis concentrates the dye on the covered fibre (dye conserved)", () => {
    const local = predictLayer(base, teal({ coverage: 0.25, dosBasis: "skein" }));
    const fourTimes = predictLayer(base, {
      dyes: [{ profile: P.turquoise, dosPct: 4 }, { profile: P["golden-yellow"], dosPct: 1.6 }],
    });
    expect(deltaE00(local.palette[0].lab, fourTimes.lab)).toBeLessThan(1e-9);
  });
});

describe("gradients (dip-dye)", () => {
  const gradient = { sections: 5, depths: [1, 0.75, 0.5, 0.25, 0] };
  it("lightness rises monotonically as the depth falls; depth 0 is the base", () => {
    const p = predictLayer(base, teal({ gradient }));
    expect(p.gradient).toHaveLength(5);
    for (let s = 1; s < 5; s++) expect(p.gradient![s].L).toBeGreaterThan(p.gradient![s - 1].L);
    expect(deltaE00(p.gradient![4], base)).toBeLessThan(1e-6);
    expect(sumShares(p)).toBeCloseTo(1, 12);
    expect(p.palette).toHaveLength(5);
    p.palette.forEach((e) => expect(e.share).toBeCloseTo(0.2, 12));
  });
  it("a second gradient with the same sections lines up with the first (same dip order)", () => {
    const [, two] = predictLayers(base, [
      teal({ gradient }),
      { dyes: [{ profile: P.magenta, dosPct: 0.5 }], gradient: { sections: 5, depths: [0, 0, 0, 0, 1] } },
    ]);
    expect(two.state.patches).toHaveLength(5);
    // Section 0 got only the first layer, section 4 only the second.
    const first = predictLayer(base, teal()).lab;
    const second = predictLayer(base, { dyes: [{ profile: P.magenta, dosPct: 0.5 }] }).lab;
    expect(deltaE00(two.gradient![0], first)).toBeLessThan(1e-9);
    expect(deltaE00(two.gradient![4], second)).toBeLessThan(1e-9);
  });
});

describe("chaining layers", () => {
  it("the prediction of layer k is the base of layer k+1", () => {
    const layers = [teal({ coverage: 0.4 }), { dyes: [{ profile: P.magenta, dosPct: 0.6 }] }];
    const [a, b] = predictLayers(base, layers);
    const again = predictLayer(a.state, layers[1]);
    expect(deltaE00(b.lab, again.lab)).toBe(0);
    // Over-dyeing a speckled skein dyes both areas: still two areas, both with magenta on them.
    expect(b.palette).toHaveLength(2);
    expect(sumShares(b)).toBeCloseTo(1, 12);
    for (const e of b.palette) expect(e.lab.a).toBeGreaterThan(a.palette.find((x) => Math.abs(x.share - e.share) < 1e-12)!.lab.a);
  });
  it("accepts an earlier prediction itself as the base, and refuses a base that is not a colour", () => {
    const a = predictLayer(base, teal());
    const b = predictLayer(a, { dyes: [{ profile: P.magenta, dosPct: 0.6 }] });
    expect(deltaE00(b.lab, predictLayer(a.state, { dyes: [{ profile: P.magenta, dosPct: 0.6 }] }).lab)).toBe(0);
    expect(() => predictLayer({ L: Number.NaN, a: 0, b: 0 }, teal())).toThrow(/not a CIELAB value/);
    expect(() => predictLayer(new Float64Array(31), teal())).toThrow(/36 bands/);
  });
  it("accepts a bare reflectance curve as the base", () => {
    const p = predictLayer(SYNTHETIC_BASES.grey, { dyes: [{ profile: P.magenta, dosPct: 1 }] });
    expect(p.lab.a).toBeGreaterThan(20);
  });
});
