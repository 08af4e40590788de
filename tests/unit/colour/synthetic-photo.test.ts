// The whole photo path on synthetic photos with known answers: render → JPEG (sharp) → decode →
// calibrate from the demo card → read swatches. Accuracy targets are Undertone's own (issue 3).
import { describe, expect, it } from "vitest";
import { calibrateCard, patchGrid, samplePatch, type Calibration, type RawImage } from "@/colour/calibration";
import { deltaE00 } from "@/colour/difference";
import { labToSrgb } from "@/colour/spaces";
import { cropPixels, readSwatch, type SwatchReading } from "@/colour/swatch";
import { DEMO_CARD, renderPhoto, type SyntheticPhoto, type YarnSpec } from "@/colour/synthetic";
import type { Lab } from "@/colour/types";
import { throughJpeg } from "../../support/synthetic-jpeg";

const L = (L: number, a: number, b: number): Lab => ({ L, a, b });
const SPECS: YarnSpec[] = [
  { kind: "solid", lab: L(60, 28, 8) }, { kind: "solid", lab: L(40, -25, -12) }, { kind: "solid", lab: L(68, 8, 58) },
  { kind: "solid", lab: L(30, 6, -28) }, { kind: "solid", lab: L(55, -20, 30) }, { kind: "solid", lab: L(78, 2, 12) },
  { kind: "speckled", base: L(82, 2, 10), speckles: [{ lab: L(45, 55, -5), share: 0.15 }, { lab: L(45, -30, -10), share: 0.1 }] },
  { kind: "variegated", sections: [{ lab: L(55, 45, 35), share: 0.5 }, { lab: L(70, 10, 60), share: 0.3 }, { lab: L(40, -20, -25), share: 0.2 }] },
  { kind: "speckled", base: L(35, 10, -30), speckles: [{ lab: L(85, 0, 5), share: 0.2 }, { lab: L(70, 10, 65), share: 0.08 }] },
];
/** Strands 28 px wide: a worsted strand seen in a 12 MP phone photo of a swatch filling a fifth of the frame [our estimate]. */
const TEXTURE = { period: 28 };
const MARGIN = 6; // read inside each swatch, away from its edges

const scenes = new Map<number, SyntheticPhoto>();
function scene(seed: number): SyntheticPhoto {
  if (!scenes.has(seed)) scenes.set(seed, render(seed));
  return scenes.get(seed)!;
}
function render(seed: number): SyntheticPhoto {
  return renderPhoto({
    width: 1600, height: 1200, seed,
    swatches: SPECS.map((spec, i) => ({
      spec, texture: TEXTURE, rect: { x: 760 + (i % 3) * 270, y: 150 + Math.floor(i / 3) * 320, width: 240, height: 280 },
    })),
  });
}

function calibrate(photo: SyntheticPhoto, image: RawImage): Calibration {
  const places = patchGrid(photo.gridCorners, DEMO_CARD.rows, DEMO_CARD.cols);
  return calibrateCard(places.map((p, i) => ({ known: DEMO_CARD.patches[i].lab, name: DEMO_CARD.patches[i].name, ...samplePatch(image, p.rect) })));
}

/** Each truth colour's share over exactly the pixels read (the swatch minus its margin). */
function truthShares(t: SyntheticPhoto["swatches"][number]): number[] {
  const counts = t.palette.map(() => 0);
  for (let y = MARGIN; y < t.rect.height - MARGIN; y++) {
    for (let x = MARGIN; x < t.rect.width - MARGIN; x++) counts[t.labels[y * t.rect.width + x]]++;
  }
  const total = counts.reduce((s, v) => s + v, 0);
  return counts.map((c) => c / total);
}

function readAll(photo: SyntheticPhoto, image: RawImage, cal: Calibration): SwatchReading[] {
  return photo.swatches.map((t) =>
    readSwatch(cropPixels(image, { x: t.rect.x + MARGIN, y: t.rect.y + MARGIN, width: t.rect.width - 2 * MARGIN, height: t.rect.height - 2 * MARGIN }), 3, cal),
  );
}

describe("the demo reference card", () => {
  it("is 4 × 6: a row of six greys, then eighteen colours, all inside the sRGB gamut", () => {
    expect(DEMO_CARD.patches).toHaveLength(DEMO_CARD.rows * DEMO_CARD.cols);
    expect([DEMO_CARD.rows, DEMO_CARD.cols]).toEqual([4, 6]);
    DEMO_CARD.patches.forEach((p, i) => {
      const chroma = Math.hypot(p.lab.a, p.lab.b);
      if (i < 6) expect(chroma).toBe(0);
      else expect(chroma).toBeGreaterThan(15);
      expect(labToSrgb(p.lab).inGamut).toBe(true);
    });
    const greys = DEMO_CARD.patches.slice(0, 6).map((p) => p.lab.L);
    expect(greys).toEqual([...greys].sort((a, b) => b - a)); // lightest first
  });
});

describe("renderPhoto", () => {
  it("is repeatable for a seed and differs between seeds", () => {
    const a = renderPhoto({ width: 320, height: 240, seed: 4 }), b = renderPhoto({ width: 320, height: 240, seed: 4 });
    const c = renderPhoto({ width: 320, height: 240, seed: 5 });
    expect(Buffer.from(a.data).equals(Buffer.from(b.data))).toBe(true);
    expect(Buffer.from(a.data).equals(Buffer.from(c.data))).toBe(false);
  });
  it("reports each swatch's shares summing to 1 and a label for every pixel", () => {
    const photo = scene(1);
    for (const t of photo.swatches) {
      expect(t.palette.reduce((s, p) => s + p.share, 0)).toBeCloseTo(1, 12);
      expect(t.labels).toHaveLength(t.rect.width * t.rect.height);
    }
  });
});

describe.each([1, 2, 3])("through a JPEG (quality 90, 4:2:0), seed %i", (seed) => {
  it("calibrates from the card and reads solid swatches within mean 1.0 / max 2.5 ΔE00, shares within ±0.05", async () => {
    const photo = scene(seed);
    const image = await throughJpeg(photo, { quality: 90, chromaSubsampling: "4:2:0" });
    const cal = calibrate(photo, image);
    expect(cal.quality).toBe("good");
    const readings = readAll(photo, image, cal);

    const de = photo.swatches.flatMap((t, i) => (t.kind === "solid" ? [deltaE00(t.lab, readings[i].lab)] : []));
    expect(de).toHaveLength(6);
    expect(de.reduce((s, v) => s + v, 0) / de.length).toBeLessThanOrEqual(1.0); // issue 3 target
    expect(Math.max(...de)).toBeLessThanOrEqual(2.5); // issue 3 target

    photo.swatches.forEach((t, i) => {
      if (t.kind === "solid") {
        expect(readings[i].palette).toHaveLength(1);
        return;
      }
      const shares = truthShares(t);
      expect(readings[i].palette).toHaveLength(t.palette.length);
      t.palette.forEach((tp, k) => {
        const found = readings[i].palette.reduce((b, p) => (deltaE00(p.lab, tp.lab) < deltaE00(b.lab, tp.lab) ? p : b));
        expect(deltaE00(found.lab, tp.lab)).toBeLessThan(5);
        expect(Math.abs(found.share - shares[k])).toBeLessThanOrEqual(0.05); // issue 3 target
      });
    });
  });
});
