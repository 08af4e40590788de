// A synthetic photo: a table, the reference card in perspective, and yarn swatches of known colour,
// shot through the synthetic camera. Pure: returns raw 8-bit RGB and the ground truth.
import { squareToQuadMatrix, type PixelRect, type Point } from "../calibration/grid";
import { labToXyz } from "../spaces";
import type { Lab } from "../types";
import { makeCamera, type SyntheticCameraSpec } from "./camera";
import { DEMO_CARD, type ReferenceCardSpec } from "./card";
import { seededRandom } from "./random";
import { DEFAULT_TEXTURE, renderYarn, type YarnSpec, type YarnTexture, type YarnTruth } from "./yarn";

export interface PhotoOptions {
  width: number;
  height: number;
  seed?: number;
  camera?: SyntheticCameraSpec;
  card?: ReferenceCardSpec;
  /** Outer corners of the card's patch grid in the photo (TL, TR, BR, BL); default: left part, mild perspective. */
  gridCorners?: [Point, Point, Point, Point];
  /** Swatches and where they lie; default: none. */
  swatches?: { spec: YarnSpec; rect: PixelRect; texture?: Partial<YarnTexture> }[];
  /** Colour of the table under everything. */
  table?: Lab;
}

export interface SyntheticPhoto {
  width: number;
  height: number;
  channels: 3;
  /** Interleaved 8-bit RGB, row-major. */
  data: Uint8Array;
  card: ReferenceCardSpec;
  gridCorners: [Point, Point, Point, Point];
  /** Each swatch's truth; `labels` gives every pixel of `rect` its palette index (row by row). */
  swatches: (YarnTruth & { rect: PixelRect; kind: YarnSpec["kind"]; labels: Uint8Array })[];
}

/** Default grid corners: the card on the left third of the frame, slightly rotated and foreshortened. */
export function defaultGridCorners(width: number, height: number, card: ReferenceCardSpec = DEMO_CARD): [Point, Point, Point, Point] {
  const w = width * 0.36, h = (w * card.rows) / card.cols;
  const x0 = width * 0.05, y0 = (height - h) / 2;
  return [
    { x: x0 + w * 0.02, y: y0 },
    { x: x0 + w, y: y0 + h * 0.05 },
    { x: x0 + w * 0.97, y: y0 + h * 1.02 },
    { x: x0, y: y0 + h * 0.96 },
  ];
}

/** Render a synthetic photo with its ground truth (see the module files for the camera and yarn models). */
export function renderPhoto(options: PhotoOptions): SyntheticPhoto {
  const { width, height } = options;
  const seed = options.seed ?? 1;
  const rand = seededRandom(seed);
  const camera = makeCamera(options.camera);
  const card = options.card ?? DEMO_CARD;
  const corners = options.gridCorners ?? defaultGridCorners(width, height, card);
  const data = new Uint8Array(width * height * 3);

  // The table: a warm surface with a slow grain.
  const table = labToXyz(options.table ?? { L: 55, a: 6, b: 14 });
  for (let y = 0, o = 0; y < height; y++) {
    for (let x = 0; x < width; x++, o += 3) {
      const k = 1 + 0.05 * Math.sin(x * 0.013 + 2 * Math.sin(y * 0.004)) + 0.02 * Math.sin(y * 0.07);
      camera.shoot(k * table.X, k * table.Y, k * table.Z, rand, data, o);
    }
  }
  drawCard(card, corners, width, height, (X, Y, Z, o) => camera.shoot(X, Y, Z, rand, data, o));

  const swatches: SyntheticPhoto["swatches"] = [];
  (options.swatches ?? []).forEach(({ spec, rect, texture }, i) => {
    const { xyz, labels, truth } = renderYarn(spec, rect.width, rect.height, rand, { ...DEFAULT_TEXTURE, ...texture }, seed * 31 + i);
    for (let y = 0; y < rect.height; y++) {
      for (let x = 0; x < rect.width; x++) {
        const s = (y * rect.width + x) * 3;
        camera.shoot(xyz[s], xyz[s + 1], xyz[s + 2], rand, data, ((rect.y + y) * width + rect.x + x) * 3);
      }
    }
    swatches.push({ ...truth, rect, kind: spec.kind, labels });
  });
  return { width, height, channels: 3, data, card, gridCorners: corners, swatches };
}

/** Paint the card: a paper body a little larger than the grid, then each patch, through the inverse homography. */
function drawCard(
  card: ReferenceCardSpec,
  corners: [Point, Point, Point, Point],
  width: number,
  height: number,
  put: (X: number, Y: number, Z: number, offset: number) => void,
) {
  const inv = invert3(squareToQuadMatrix(corners));
  const patches = card.patches.map((p) => labToXyz(p.lab));
  const body = labToXyz({ L: 93, a: 0, b: 2 });
  const gap = card.gapMm / (card.patchMm + card.gapMm) / 2; // half gap on each side of a cell
  const margin = 0.35; // card border around the grid, in cells
  const xs = corners.map((c) => c.x), ys = corners.map((c) => c.y);
  const span = Math.max(...xs) - Math.min(...xs);
  const pad = (span / card.cols) * (margin + 0.1) * 2;
  const xLo = Math.max(0, Math.floor(Math.min(...xs) - pad)), xHi = Math.min(width - 1, Math.ceil(Math.max(...xs) + pad));
  const yLo = Math.max(0, Math.floor(Math.min(...ys) - pad)), yHi = Math.min(height - 1, Math.ceil(Math.max(...ys) + pad));
  for (let y = yLo; y <= yHi; y++) {
    for (let x = xLo; x <= xHi; x++) {
      const w = inv[6] * x + inv[7] * y + inv[8];
      const gu = ((inv[0] * x + inv[1] * y + inv[2]) / w) * card.cols;
      const gv = ((inv[3] * x + inv[4] * y + inv[5]) / w) * card.rows;
      if (gu < -margin || gv < -margin || gu > card.cols + margin || gv > card.rows + margin) continue;
      let c = body;
      const col = Math.floor(gu), row = Math.floor(gv);
      if (col >= 0 && row >= 0 && col < card.cols && row < card.rows) {
        const fu = gu - col, fv = gv - row;
        if (fu > gap && fu < 1 - gap && fv > gap && fv < 1 - gap) c = patches[row * card.cols + col];
      }
      put(c.X, c.Y, c.Z, (y * width + x) * 3);
    }
  }
}

/** Inverse of a row-major 3×3 matrix (adjugate over determinant). */
function invert3(m: number[]): number[] {
  const [a, b, c, d, e, f, g, h, i] = m;
  const A = e * i - f * h, B = -(d * i - f * g), C = d * h - e * g;
  const det = a * A + b * B + c * C;
  return [
    A / det, -(b * i - c * h) / det, (b * f - c * e) / det,
    B / det, (a * i - c * g) / det, -(a * f - c * d) / det,
    C / det, -(a * h - b * g) / det, (a * e - b * d) / det,
  ];
}
