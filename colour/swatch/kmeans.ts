// k-means with k-means++ seeding on 3-D points (CIELAB triples), weighted per axis.
//
// k-means++: D. Arthur and S. Vassilvitskii, "k-means++: the advantages of careful seeding",
// Proc. ACM-SIAM SODA 2007, pp. 1027–1035. Lloyd iterations until under 0.1 % of points move.

export interface KMeansResult {
  /** k centres, 3 values each (unweighted coordinates). */
  centres: Float64Array;
  /** Cluster of each point. */
  assign: Uint8Array;
  /** Points in each cluster. */
  counts: Uint32Array;
  /** Sum of squared weighted distances to the centres. */
  sse: number;
}

/** Seeded uniform [0, 1) (mulberry32), so clustering is repeatable. */
export function seeded(seed: number): () => number {
  let s = seed | 0;
  return () => {
    s = (s + 0x6d2b79f5) | 0;
    let t = Math.imul(s ^ (s >>> 15), 1 | s);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * Cluster n points (xyz-interleaved in `points`) into k groups; `weights` scale each axis in the
 * distance (e.g. lightness down-weighted). Best of `restarts` seeded runs by SSE.
 */
export function kmeans(
  points: Float64Array, k: number, weights: readonly [number, number, number], random: () => number, restarts = 2, maxIter = 40,
): KMeansResult {
  const n = points.length / 3;
  if (k < 1 || k > n || k > 255) throw new RangeError(`k must be between 1 and ${Math.min(n, 255)}.`);
  let best: KMeansResult | null = null;
  for (let r = 0; r < restarts; r++) {
    const run = lloyd(points, seedCentres(points, k, weights, random), weights, maxIter);
    if (!best || run.sse < best.sse) best = run;
  }
  return best!;
}

/** Assign each point to its nearest centre; returns the summed squared distance. */
export function assignNearest(
  points: Float64Array, centres: Float64Array, weights: readonly [number, number, number], assign: Uint8Array,
): number {
  const k = centres.length / 3, [w0, w1, w2] = weights;
  let sse = 0;
  for (let i = 0, p = 0; p < points.length; i++, p += 3) {
    let bestD = Infinity, bestJ = 0;
    for (let j = 0; j < k; j++) {
      const d0 = points[p] - centres[j * 3], d1 = points[p + 1] - centres[j * 3 + 1], d2 = points[p + 2] - centres[j * 3 + 2];
      const d = w0 * d0 * d0 + w1 * d1 * d1 + w2 * d2 * d2;
      if (d < bestD) { bestD = d; bestJ = j; }
    }
    assign[i] = bestJ;
    sse += bestD;
  }
  return sse;
}

function seedCentres(points: Float64Array, k: number, w: readonly [number, number, number], random: () => number): Float64Array {
  const n = points.length / 3;
  const centres = new Float64Array(k * 3);
  const dist = new Float64Array(n).fill(Infinity);
  let pick = Math.floor(random() * n);
  for (let j = 0; j < k; j++) {
    centres.set(points.subarray(pick * 3, pick * 3 + 3), j * 3);
    let total = 0;
    for (let i = 0; i < n; i++) {
      const d0 = points[i * 3] - centres[j * 3], d1 = points[i * 3 + 1] - centres[j * 3 + 1], d2 = points[i * 3 + 2] - centres[j * 3 + 2];
      dist[i] = Math.min(dist[i], w[0] * d0 * d0 + w[1] * d1 * d1 + w[2] * d2 * d2);
      total += dist[i];
    }
    // Next centre with probability proportional to squared distance (k-means++).
    let target = random() * total;
    pick = n - 1;
    for (let i = 0; i < n; i++) {
      target -= dist[i];
      if (target < 0) { pick = i; break; }
    }
  }
  return centres;
}

function lloyd(points: Float64Array, centres: Float64Array, w: readonly [number, number, number], maxIter: number): KMeansResult {
  const n = points.length / 3, k = centres.length / 3;
  const assign = new Uint8Array(n).fill(255);
  const next = new Uint8Array(n);
  const counts = new Uint32Array(k);
  let sse = 0;
  for (let iter = 0; iter < maxIter; iter++) {
    sse = assignNearest(points, centres, w, next);
    let changed = 0;
    for (let i = 0; i < n; i++) if (next[i] !== assign[i]) { changed++; assign[i] = next[i]; }
    if (changed <= n * 0.001) break; // fewer than 0.1 % of points moved: converged for our purpose
    const sums = new Float64Array(k * 3);
    counts.fill(0);
    for (let i = 0; i < n; i++) {
      const j = assign[i];
      counts[j]++;
      sums[j * 3] += points[i * 3];
      sums[j * 3 + 1] += points[i * 3 + 1];
      sums[j * 3 + 2] += points[i * 3 + 2];
    }
    for (let j = 0; j < k; j++) {
      if (counts[j] === 0) continue; // an emptied centre stays where it was
      for (let c = 0; c < 3; c++) centres[j * 3 + c] = sums[j * 3 + c] / counts[j];
    }
  }
  counts.fill(0);
  for (let i = 0; i < n; i++) counts[assign[i]]++;
  return { centres, assign, counts, sse };
}
