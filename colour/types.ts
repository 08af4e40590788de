// Shared value types of the colour module. All CIELAB values are CIELAB under D65 (2° observer).

/** CIELAB D65: L* 0–100, a*, b* unbounded. */
export interface Lab {
  L: number;
  a: number;
  b: number;
}

/** CIE LCh(ab) D65: h in degrees 0–360. */
export interface Lch {
  L: number;
  C: number;
  h: number;
}

/** CIE XYZ D65 scaled so that the white has Y = 1. */
export interface Xyz {
  X: number;
  Y: number;
  Z: number;
}

/** Three channels, either 0–255 (8-bit camera/sRGB) or 0–1 (linear), as each function states. */
export type Rgb = readonly [number, number, number];

/** A dominant colour of a region and the share of its area (0–1, shares of a palette sum to 1). */
export interface PaletteEntry {
  lab: Lab;
  share: number;
}

/** A reflectance curve: 36 values, 380–730 nm at 10 nm, each in (0, 1). */
export type Reflectance = Float64Array;
