// Undertone's demo reference card: an invented 4 × 6 layout of greys and dye-like colours.
//
// The patch values are nominal CIELAB D65 targets of our own choosing (all inside the sRGB gamut so
// the app can show them and the synthetic camera can render them). A printed card must be measured
// and its measured values stored with it; these are the values of the demo studio's card.
import type { Lab } from "../types";

export interface CardPatchSpec {
  name: string;
  lab: Lab;
}

export interface ReferenceCardSpec {
  name: string;
  rows: number;
  cols: number;
  /** Row by row, top-left first; rows × cols entries. */
  patches: CardPatchSpec[];
  /** Printed size of one patch and the gap between patches, in millimetres. */
  patchMm: number;
  gapMm: number;
}

const p = (name: string, L: number, a: number, b: number): CardPatchSpec => ({ name, lab: { L, a, b } });

/** The demo studio's reference card: a row of six greys, then three rows of dye-like colours. */
export const DEMO_CARD: ReferenceCardSpec = {
  name: "Undertone demo card",
  rows: 4,
  cols: 6,
  patchMm: 18,
  gapMm: 2,
  patches: [
    p("paper", 96, 0, 0), p("grey 80", 81, 0, 0), p("grey 65", 66, 0, 0),
    p("grey 50", 51, 0, 0), p("grey 35", 36, 0, 0), p("ink", 22, 0, 0),
    p("madder", 42, 55, 30), p("marigold", 70, 20, 62), p("moss", 52, -30, 40),
    p("teal", 50, -28, -8), p("indigo", 35, 10, -42), p("plum", 38, 35, -22),
    p("coral", 65, 40, 25), p("straw", 85, -2, 40), p("sage", 68, -18, 15),
    p("sky", 72, -10, -25), p("lilac", 66, 18, -20), p("rose", 72, 25, 5),
    p("rust", 48, 30, 45), p("olive", 45, -5, 35), p("bottle", 36, -26, 8),
    p("navy", 28, 5, -30), p("wine", 30, 35, 5), p("fawn", 62, 8, 20),
  ],
};
