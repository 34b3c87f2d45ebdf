/**
 * Retrieval of the truth among candidates (MATH.md §4, "rank of the true encoding among
 * candidates"): for query q the candidates are the true encodings of the same waypoint in
 * the tasks of the batch (the first RETRIEVAL_LIMIT of them, plus q's own, so the cost stays
 * bounded for large eval.queries); the rank of q's own truth by distance to q's prediction.
 */

/** Most candidates per query. */
export const RETRIEVAL_LIMIT = 1000;

/** Ranks (1 = nearest) of each query's own truth: predicted, truth [count, dim] → [count]. */
export function retrievalRanks(
  predicted: Float64Array,
  truth: Float64Array,
  count: number,
  dim: number,
): Int32Array {
  const ranks = new Int32Array(count);
  for (let q = 0; q < count; q++) {
    const own = squaredDistance(predicted, q, truth, q, dim);
    let rank = 1;
    // Ties count against the truth (a strict rule cannot inflate top-1 by duplicates).
    const candidates = Math.min(count, RETRIEVAL_LIMIT);
    for (let c = 0; c < candidates; c++) {
      if (c !== q && squaredDistance(predicted, q, truth, c, dim) <= own) rank++;
    }
    ranks[q] = rank;
  }
  return ranks;
}

function squaredDistance(
  a: Float64Array,
  i: number,
  b: Float64Array,
  j: number,
  dim: number,
): number {
  let s = 0;
  for (let k = 0; k < dim; k++) s += (a[i * dim + k]! - b[j * dim + k]!) ** 2;
  return s;
}
