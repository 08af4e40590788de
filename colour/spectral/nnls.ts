// Non-negative least squares, Lawson & Hanson, "Solving Least Squares Problems" (1974), ch. 23,
// for the small systems of the dye-profile fit (a handful of unknowns), on ml-matrix.
import { Matrix, solve } from "ml-matrix";

/** min ‖A x − b‖ subject to x ≥ 0 (Lawson–Hanson active set). A is m×n, b has m entries. */
export function nnls(A: Matrix, b: readonly number[], tolerance = 1e-12): number[] {
  const m = A.rows, n = A.columns;
  if (b.length !== m) throw new RangeError(`b has ${b.length} entries; A has ${m} rows.`);
  const x = new Array<number>(n).fill(0);
  const passive = new Array<boolean>(n).fill(false);
  const bm = Matrix.columnVector([...b]);
  const gradient = (): number[] => {
    // w = Aᵀ (b − A x)
    const r = bm.clone().sub(A.mmul(Matrix.columnVector(x)));
    return A.transpose().mmul(r).getColumn(0);
  };
  const subSolve = (cols: number[]): number[] => {
    const sub = A.subMatrixColumn(cols);
    return solve(sub, bm, true).getColumn(0); // SVD-based: tolerant of dependent columns
  };
  for (let outer = 0; outer < 3 * n + 10; outer++) {
    const w = gradient();
    let j = -1, best = tolerance;
    for (let k = 0; k < n; k++) if (!passive[k] && w[k] > best) { best = w[k]; j = k; }
    if (j < 0) break;
    passive[j] = true;
    for (let inner = 0; inner < 3 * n + 10; inner++) {
      const cols = passive.flatMap((p, k) => (p ? [k] : []));
      if (cols.length === 0) break;
      const zp = subSolve(cols);
      const z = new Array<number>(n).fill(0);
      cols.forEach((c, k) => (z[c] = zp[k]));
      if (cols.every((c) => z[c] > 0)) {
        for (let k = 0; k < n; k++) x[k] = z[k];
        break;
      }
      // Step back towards x until the first passive variable reaches zero, then drop it.
      let alpha = 1;
      for (const c of cols) if (z[c] <= 0) alpha = Math.min(alpha, x[c] / (x[c] - z[c]));
      for (let k = 0; k < n; k++) x[k] += alpha * (z[k] - x[k]);
      for (const c of cols) if (x[c] <= tolerance) { passive[c] = false; x[c] = 0; }
    }
  }
  return x;
}
