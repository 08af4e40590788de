// The comparison model for the prediction self-test: reflectances multiply. Each dye is a spectral
// filter whose log reflectance adds with depth, i.e. the weighted geometric mean / product of
// reflectances that Burns uses for subtractive paint mixing (arXiv:1710.06364), with the filter per
// 1 % DOS learnt from the same calibration dyeings by least squares on log(ρ_result / ρ_base).
import { Matrix } from "ml-matrix";
import type { Lab, Reflectance } from "@/colour/types";
import { BANDS } from "@/colour/spectral/cie-data";
import { labToReflectance, reflectanceToLab } from "@/colour/spectral/reflectance";
import { nnls } from "@/colour/spectral/nnls";
import type { CalibrationDyeing, DyeAmount } from "@/colour/spectral/profile";

export type NaiveFilters = Map<string, Float64Array>; // −log filter per 1 % DOS (≥ 0)

export function fitNaive(dyeings: CalibrationDyeing[]): NaiveFilters {
  const ids = [...new Set(dyeings.flatMap((d) => d.dyes.map((x) => x.dyeId)))];
  const A = Matrix.zeros(dyeings.length, ids.length);
  dyeings.forEach((d, r) => d.dyes.forEach((x) => A.set(r, ids.indexOf(x.dyeId), x.dosPct * (d.uptake ?? 1))));
  const y = dyeings.map((d) => {
    const b = labToReflectance(d.base).reflectance, res = labToReflectance(d.result).reflectance;
    return Float64Array.from(b, (v, i) => Math.log(v / res[i]));
  });
  const out: NaiveFilters = new Map(ids.map((id) => [id, new Float64Array(BANDS)]));
  for (let band = 0; band < BANDS; band++) {
    const k = nnls(A, y.map((v) => v[band]));
    ids.forEach((id, i) => (out.get(id)![band] = k[i]));
  }
  return out;
}

export function predictNaive(filters: NaiveFilters, base: Lab | Reflectance, dyes: DyeAmount[], uptake = 1): Reflectance {
  const rho = base instanceof Float64Array ? base : labToReflectance(base).reflectance;
  return Float64Array.from(rho, (v, i) => {
    let a = 0;
    for (const d of dyes) a += d.dosPct * uptake * filters.get(d.dyeId)![i];
    return v * Math.exp(-a);
  });
}

export const naiveLab = (filters: NaiveFilters, base: Lab | Reflectance, dyes: DyeAmount[], uptake = 1): Lab =>
  reflectanceToLab(predictNaive(filters, base, dyes, uptake));
