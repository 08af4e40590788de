import { describe, expect, it } from "vitest";
import { Matrix, solve } from "ml-matrix";
import {
  CalibrationError, calibrateCard, features, fitModel, fitToneCurve, patchGrid, predictXyz, restoreCalibration,
  samplePatch, type CardPatch,
} from "@/colour/calibration";
import { assessQuality } from "@/colour/calibration/checks";
import { deltaE00 } from "@/colour/difference";
import { labToXyz, xyzToLab } from "@/colour/spaces";
import { DEMO_CARD, makeCamera, seededRandom } from "@/colour/synthetic";
import type { Lab, Rgb, Xyz } from "@/colour/types";

// A noiseless camera: scene XYZ → camera linear by a fixed matrix (the synthetic camera's, which
// includes a warm light), optional root-polynomial-like crosstalk, then a pure power-law encoding.
const CAMERA = makeCamera().matrix;
function shoot(lab: Lab, { cross = 0, gamma = 2.2, exposure = 1 } = {}): Rgb {
  const x = labToXyz(lab);
  const c = [0, 1, 2].map((r) => Math.max(CAMERA[r * 3] * x.X + CAMERA[r * 3 + 1] * x.Y + CAMERA[r * 3 + 2] * x.Z, 0));
  const d = [
    c[0] + cross * Math.sqrt(c[1] * c[2]), c[1] + cross * Math.sqrt(c[0] * c[2]), c[2] + cross * Math.sqrt(c[0] * c[1]),
  ].map((v) => v / (1 + cross));
  return d.map((v) => 255 * Math.pow(v * exposure, 1 / gamma)) as unknown as Rgb;
}
const ring = (L: number, C: number, step: number): Lab[] =>
  Array.from({ length: 360 / step }, (_, i) => ({ L, a: C * Math.cos((i * step * Math.PI) / 180), b: C * Math.sin((i * step * Math.PI) / 180) }));
const CARD: Lab[] = DEMO_CARD.patches.map((p) => p.lab);
const EXTRA: Lab[] = [...ring(45, 35, 30), ...ring(65, 25, 30)];
const card = (labs: Lab[], opts?: Parameters<typeof shoot>[1]): CardPatch[] => labs.map((known) => ({ known, rgb: shoot(known, opts) }));

function catchError(f: () => unknown): CalibrationError {
  try {
    f();
  } catch (e) {
    if (e instanceof CalibrationError) return e;
    throw e;
  }
  throw new Error("expected a CalibrationError");
}

describe("tone curve from the greys", () => {
  const greys = [96, 81, 66, 51, 36, 22].map((L) => ({ L, a: 0, b: 0 }));
  it("recovers a power-law camera exactly, between and beyond the greys", () => {
    // A power law is a straight line in log–log space, so the piecewise fit is exact for it.
    const curve = fitToneCurve(greys.map((lab) => ({ rgb: shoot(lab, { gamma: 2.2 }), Y: labToXyz(lab).Y })));
    expect(curve.kind).toBe("piecewise");
    for (const g of curve.gamma) expect(g).toBeCloseTo(2.2, 9);
    for (const L of [10, 30, 58, 73, 99]) {
      const lab = { L, a: 0, b: 0 };
      const lin = curve.toLinear(shoot(lab, { gamma: 2.2 }));
      for (const v of lin) expect(v / labToXyz(lab).Y).toBeCloseTo(1, 9); // greys map to Y in every channel
    }
  });
  it("fits a gamma from two greys and assumes sRGB from one", () => {
    const two = fitToneCurve([greys[0], greys[3]].map((lab) => ({ rgb: shoot(lab, { gamma: 1.9 }), Y: labToXyz(lab).Y })));
    expect(two.kind).toBe("gamma");
    for (const g of two.gamma) expect(g).toBeCloseTo(1.9, 9);
    const one = fitToneCurve([{ rgb: [200, 200, 200], Y: 0.5 }]);
    expect(one.kind).toBe("srgb");
    expect(one.toLinear([255, 255, 255])[0]).toBeCloseTo(1, 12); // IEC 61966-2-1: code 255 → 1
  });
  it("gives an 8-bit lookup table equal to the curve", () => {
    const curve = fitToneCurve(greys.map((lab) => ({ rgb: shoot(lab), Y: labToXyz(lab).Y })));
    for (const code of [0, 17, 128, 255]) expect(curve.lut[1][code]).toBeCloseTo(curve.toLinear([code, code, code])[1], 12);
  });
});

describe("calibrateCard: exact recovery", () => {
  it("reproduces every patch and unseen colours of a noiseless linear camera", () => {
    const cal = calibrateCard(card(CARD));
    expect(cal.model).toBe("matrix3x3");
    expect(cal.maxDe00).toBeLessThan(1e-6);
    expect(cal.looMaxDe00).toBeLessThan(1e-6);
    for (const lab of EXTRA) expect(deltaE00(cal.apply(shoot(lab)), lab)).toBeLessThan(1e-6);
    expect(cal.quality).toBe("good");
  });
  it("rebuilds the same correction from its stored parameters", () => {
    const cal = calibrateCard(card(CARD, { cross: 0.3 }));
    const again = restoreCalibration(JSON.parse(JSON.stringify(cal.params)));
    for (const lab of EXTRA) {
      const rgb = shoot(lab, { cross: 0.3 });
      const p = cal.apply(rgb), q = again.apply(rgb);
      expect(Math.abs(p.L - q.L) + Math.abs(p.a - q.a) + Math.abs(p.b - q.b)).toBeLessThan(1e-12);
    }
  });
});

describe("calibrateCard: leave-one-out", () => {
  // Noisy camera values so that leaving a patch out matters.
  const random = seededRandom(7);
  const noisy = card([...CARD, ...EXTRA], { cross: 0.15 }).map((p) => ({
    ...p, rgb: p.rgb.map((v) => v + 1.5 * random.normal()) as unknown as Rgb,
  }));
  const cal = calibrateCard(noisy);

  it("matches a fit redone by hand without each patch", () => {
    const neutral = noisy.map((p) => Math.hypot(p.known.a, p.known.b) < 5);
    const xyz = noisy.map((p) => labToXyz(p.known));
    const by = noisy.map((p, i) => {
      const keep = (_: unknown, j: number) => j !== i;
      const curve = fitToneCurve(noisy.flatMap((q, j) => (j !== i && neutral[j] ? [{ rgb: q.rgb, Y: xyz[j].Y }] : [])));
      const fit = fitModel(cal.model, noisy.filter(keep).map((q) => curve.toLinear(q.rgb)), xyz.filter(keep), neutral.filter(keep))!;
      return deltaE00(p.known, xyzToLab(predictXyz(fit, curve.toLinear(p.rgb))));
    });
    expect(cal.looMeanDe00).toBeCloseTo(by.reduce((s, v) => s + v, 0) / by.length, 9);
    expect(cal.looMaxDe00).toBeCloseTo(Math.max(...by), 9);
    cal.perPatch.forEach((p, i) => expect(p.looDe00).toBeCloseTo(by[i], 9));
  });
  it("is never better than the in-sample fit", () => {
    expect(cal.looMeanDe00).toBeGreaterThan(cal.meanDe00);
    for (const p of cal.perPatch) expect(p.looDe00!).toBeGreaterThanOrEqual(p.de00 - 1e-9);
  });
  it("grades by Undertone's thresholds: good ≤ 1.5, usable ≤ 3, retake above (product rule)", () => {
    const grade = (m: number) => assessQuality({ model: "matrix3x3", looMeanDe00: m, looMaxDe00: m }, [], [], "piecewise", ["white-balance", "matrix3x3"]);
    expect(grade(1.5).quality).toBe("good");
    expect(grade(1.51).quality).toBe("usable");
    expect(grade(3).quality).toBe("usable");
    expect(grade(3.01).quality).toBe("retake");
    expect(grade(3.01).reasons.join(" ")).toMatch(/Retake/);
  });
});

describe("calibrateCard: model choice", () => {
  it("white balance alone from a single grey, with unknown accuracy", () => {
    const cal = calibrateCard(card([{ L: 66, a: 0, b: 0 }]));
    expect(cal.model).toBe("white-balance");
    expect(Number.isNaN(cal.looMeanDe00)).toBe(true);
    expect(cal.quality).toBe("usable");
    expect(cal.reasons.join(" ")).toMatch(/single grey/);
    expect(cal.reasons.join(" ")).toMatch(/assumed to be sRGB/);
    expect(deltaE00(cal.apply(shoot({ L: 66, a: 0, b: 0 })), { L: 66, a: 0, b: 0 })).toBeLessThan(1e-6);
  });
  it("a 3×3 matrix from a few patches (too few for a root-polynomial)", () => {
    const few = [...CARD.slice(0, 4), ...CARD.slice(6, 10)];
    const cal = calibrateCard(card(few, { cross: 0.3 }));
    expect(cal.model).toBe("matrix3x3");
    expect(cal.candidates.map((c) => c.model)).toEqual(["white-balance", "matrix3x3"]);
    expect(cal.reasons.join(" ")).toMatch(/root-polynomial/);
  });
  it("root-polynomial when many patches show a non-linear camera", () => {
    const cal = calibrateCard(card([...CARD, ...EXTRA], { cross: 0.3 }));
    expect(cal.model).toBe("root-polynomial");
    const score = (m: string) => cal.candidates.find((c) => c.model === m)!.looMeanDe00;
    expect(score("root-polynomial")).toBeLessThan(score("matrix3x3"));
  });
});

describe("root-polynomial exposure invariance (Finlayson, Mackiewicz & Hurlbert 2015, IEEE TIP 24(5))", () => {
  const random = seededRandom(3);
  const lin: Rgb[] = Array.from({ length: 30 }, () => [random.next(), random.next(), random.next()]);
  const xyz: Xyz[] = lin.map(([r, g, b]) => ({ X: 0.4 * r + 0.3 * g + 0.2 * b + 0.1 * Math.sqrt(r * g), Y: 0.2 * r + 0.7 * g + 0.1 * b, Z: 0.9 * b + 0.05 * Math.sqrt(g * b) }));
  const fit = fitModel("root-polynomial", lin, xyz, lin.map(() => false))!;
  it("scaling camera RGB by k scales XYZ by k", () => {
    for (const k of [0.25, 0.5, 2, 3.7]) {
      for (const p of lin.slice(0, 5)) {
        const base = predictXyz(fit, p), scaled = predictXyz(fit, [p[0] * k, p[1] * k, p[2] * k]);
        expect(scaled.X).toBeCloseTo(k * base.X, 12);
        expect(scaled.Y).toBeCloseTo(k * base.Y, 12);
        expect(scaled.Z).toBeCloseTo(k * base.Z, 12);
      }
    }
  });
  it("uses the six terms R, G, B, √RG, √RB, √GB", () => {
    expect(features("root-polynomial", [0.25, 0.16, 0.09])).toEqual([0.25, 0.16, 0.09, 0.2, 0.15, 0.12]);
    expect(fit.coefficients).toHaveLength(18);
  });
  it("recovers XYZ that is exactly a root-polynomial of RGB", () => {
    for (const [i, p] of lin.entries()) expect(predictXyz(fit, p).X).toBeCloseTo(xyz[i].X, 10);
  });
});

describe("calibrateCard refuses what it cannot trust", () => {
  const good = card(CARD);
  it("no patches", () => {
    const e = catchError(() => calibrateCard([]));
    expect(e.code).toBe("too-few");
    expect(e.message).toMatch(/No patches were read/);
  });
  it("clipped patches, by value or by clipped share, named", () => {
    const byValue = good.map((p, i) => (i === 0 ? { ...p, rgb: [252, 240, 230] as Rgb } : p));
    const e = catchError(() => calibrateCard(byValue));
    expect(e.code).toBe("clipped");
    expect(e.patches).toEqual([0]);
    expect(e.message).toMatch(/#1 is overexposed/);
    const byShare = good.map((p, i) => (i === 6 ? { ...p, name: "madder", clippedFraction: 0.05 } : p));
    expect(catchError(() => calibrateCard(byShare)).message).toMatch(/"madder" is overexposed/);
  });
  it("an underexposed photo", () => {
    const dark = good.map((p) => ({ ...p, rgb: p.rgb.map((v) => v / 5) as unknown as Rgb }));
    const e = catchError(() => calibrateCard(dark));
    expect(e.code).toBe("too-dark");
    expect(e.message).toMatch(/too dark: the brightest patch reads 4\d of 255/);
  });
  it("a patch crushed to black", () => {
    const crushed = good.map((p, i) => (i === 5 ? { ...p, rgb: [1, 3, 4] as Rgb } : p));
    const e = catchError(() => calibrateCard(crushed));
    expect(e.code).toBe("too-dark");
    expect(e.message).toMatch(/#6 is too dark to read \(crushed to black\)/);
  });
  it("too few patches and no grey", () => {
    const e = catchError(() => calibrateCard(card(CARD.slice(6, 9))));
    expect(e.code).toBe("too-few");
    expect(e.message).toMatch(/Too few patches: 3 and none of them grey/);
  });
  it("enough patches but no grey", () => {
    const e = catchError(() => calibrateCard(card(CARD.slice(6))));
    expect(e.code).toBe("no-neutral");
    expect(e.message).toMatch(/No neutral \(grey\) patch/);
  });
  it("degenerate patches: all grey, or all one colour beside the greys", () => {
    const greys = [95, 85, 75, 65, 55, 45, 35, 25].map((L) => ({ L, a: 0, b: 0 }));
    const e = catchError(() => calibrateCard(card(greys)));
    expect(e.code).toBe("degenerate");
    expect(e.message).toMatch(/do not span three independent colours/);
    const oneColour = [...greys.slice(0, 3), ...Array.from({ length: 4 }, () => CARD[6])];
    expect(catchError(() => calibrateCard(card(oneColour))).code).toBe("degenerate");
  });
  it("greys out of order (the card read the wrong way round)", () => {
    const swapped = good.map((p, i) => (i === 0 ? { ...p, rgb: good[4].rgb } : i === 4 ? { ...p, rgb: good[0].rgb } : p));
    const e = catchError(() => calibrateCard(swapped));
    expect(e.code).toBe("out-of-order");
    expect(e.message).toMatch(/not in order of lightness/);
  });
});

describe("patchGrid", () => {
  it("places the centres of an upright grid at the cell centres", () => {
    const places = patchGrid([{ x: 100, y: 50 }, { x: 700, y: 50 }, { x: 700, y: 450 }, { x: 100, y: 450 }], 4, 6);
    expect(places).toHaveLength(24);
    expect(places[0].centre.x).toBeCloseTo(150, 9);
    expect(places[0].centre.y).toBeCloseTo(100, 9);
    expect(places[23].centre.x).toBeCloseTo(650, 9);
    expect(places[23].centre.y).toBeCloseTo(400, 9);
    expect(places[0].quad[0].x).toBeCloseTo(125, 9); // inset 0.25 of a 100 px cell
  });
  it("follows a perspective view like an independent 8-equation homography", () => {
    const corners = [{ x: 120, y: 80 }, { x: 910, y: 140 }, { x: 860, y: 700 }, { x: 60, y: 610 }] as const;
    // Direct linear solve of the homography from the four correspondences (unit square → corners).
    const src = [[0, 0], [1, 0], [1, 1], [0, 1]];
    const A: number[][] = [], b: number[] = [];
    src.forEach(([u, v], i) => {
      A.push([u, v, 1, 0, 0, 0, -u * corners[i].x, -v * corners[i].x]); b.push(corners[i].x);
      A.push([0, 0, 0, u, v, 1, -u * corners[i].y, -v * corners[i].y]); b.push(corners[i].y);
    });
    const h = solve(new Matrix(A), Matrix.columnVector(b)).to1DArray();
    const map = (u: number, v: number) => {
      const w = h[6] * u + h[7] * v + 1;
      return { x: (h[0] * u + h[1] * v + h[2]) / w, y: (h[3] * u + h[4] * v + h[5]) / w };
    };
    for (const p of patchGrid(corners, 4, 6)) {
      const q = map((p.col + 0.5) / 6, (p.row + 0.5) / 4);
      expect(p.centre.x).toBeCloseTo(q.x, 6);
      expect(p.centre.y).toBeCloseTo(q.y, 6);
      // The sampling box lies inside the inset cell: every box corner is on the inner side of every edge.
      const box = [[p.rect.x, p.rect.y], [p.rect.x + p.rect.width, p.rect.y], [p.rect.x + p.rect.width, p.rect.y + p.rect.height], [p.rect.x, p.rect.y + p.rect.height]];
      for (let e = 0; e < 4; e++) {
        const a = p.quad[e], c = p.quad[(e + 1) % 4];
        for (const [x, y] of box) expect((c.x - a.x) * (y - a.y) - (c.y - a.y) * (x - a.x)).toBeGreaterThanOrEqual(0);
      }
      expect(p.rect.width).toBeGreaterThan(20);
    }
  });
});

describe("samplePatch", () => {
  it("takes a 10 % trimmed mean per channel, ignoring specks, and counts clipped pixels", () => {
    const width = 10, height = 10, data = new Uint8Array(width * height * 3).fill(100);
    for (let i = 0; i < 5; i++) data.set([255, 255, 255], i * 3); // five specks of glare
    const s = samplePatch({ data, width, height, channels: 3 }, { x: 0, y: 0, width: 10, height: 10 });
    expect(s.rgb[0]).toBe(100);
    expect(s.clippedFraction).toBeCloseTo(0.05, 12);
    expect(s.pixels).toBe(100);
  });
});
