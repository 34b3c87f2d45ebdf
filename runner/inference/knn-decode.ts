/**
 * Decoding by exact nearest neighbours in a bank of encoded observations (MATH.md §4).
 * Squared distances use ‖a − b‖² = ‖a‖² + ‖b‖² − 2 a·b (the ‖q‖² term is constant per
 * query and dropped for ranking; common practice), with the products blocked: a block of
 * bank rows stays in cache while groups of four queries are scored against it, so each
 * bank value loaded feeds four multiply-adds.
 */
import { NumericError } from '../numeric/linalg/errors.ts';
import { checkFinite, checkInteger, checkLength } from './validate.ts';

const BANK_BLOCK = 512;
const QUERY_GROUP = 4;

/**
 * Indices of the k nearest bank rows (Euclidean) for every query, nearest first; ties go to
 * the lower bank index. bank [bankCount, dim], queries [queryCount, dim] → [queryCount, k].
 */
export function knnDecode(
  bank: Float32Array | Float64Array,
  bankCount: number,
  queries: ArrayLike<number>,
  queryCount: number,
  dim: number,
  k: number,
): Int32Array {
  checkInteger('knnDecode: dim', dim, 1);
  checkInteger('knnDecode: bankCount', bankCount, 1);
  checkInteger('knnDecode: queryCount', queryCount, 0);
  checkInteger('knnDecode: k', k, 1);
  if (k > bankCount) {
    throw new NumericError(
      'invalid-argument',
      `knnDecode: expected k ≤ bankCount = ${bankCount}, got k = ${k}`,
    );
  }
  checkLength('knnDecode: bank', bank.length, bankCount * dim, `[${bankCount}, ${dim}]`);
  checkLength('knnDecode: queries', queries.length, queryCount * dim, `[${queryCount}, ${dim}]`);
  checkFinite('knnDecode: bank', bank, dim);
  checkFinite('knnDecode: queries', queries, dim);

  const bankNorms = new Float64Array(bankCount); // [bankCount] ‖b‖²
  for (let b = 0; b < bankCount; b++) {
    let s = 0;
    for (let j = 0; j < dim; j++) s += bank[b * dim + j]! * bank[b * dim + j]!;
    bankNorms[b] = s;
  }
  // Queries padded to a multiple of the group size with zero rows whose results are dropped.
  const padded = Math.ceil(queryCount / QUERY_GROUP) * QUERY_GROUP;
  const q = new Float64Array(padded * dim); // [padded, dim]
  for (let i = 0; i < queryCount * dim; i++) q[i] = queries[i]!;
  const topDist = new Float64Array(padded * k).fill(Infinity); // [padded, k] ascending
  const topIndex = new Int32Array(padded * k).fill(-1); // [padded, k]

  // Each bank block is copied into one Float64Array scratch buffer so the inner loop is
  // monomorphic (a Float32Array or Float64Array bank alike) and the block stays in cache.
  const block = new Float64Array(BANK_BLOCK * dim); // [BANK_BLOCK, dim]
  for (let b0 = 0; b0 < bankCount; b0 += BANK_BLOCK) {
    const b1 = Math.min(bankCount, b0 + BANK_BLOCK);
    for (let i = 0; i < (b1 - b0) * dim; i++) block[i] = bank[b0 * dim + i]!;
    for (let g = 0; g < padded; g += QUERY_GROUP) {
      scoreGroup(block, bankNorms, q, g, b0, b1, dim, k, topDist, topIndex);
    }
  }
  return topIndex.slice(0, queryCount * k);
}

/** Scores queries g … g+3 against bank rows [b0, b1) (held in `block`) and updates their top-k lists. */
function scoreGroup(
  block: Float64Array,
  bankNorms: Float64Array,
  q: Float64Array,
  g: number,
  b0: number,
  b1: number,
  dim: number,
  k: number,
  topDist: Float64Array,
  topIndex: Int32Array,
): void {
  const end = b0 + ((b1 - b0) & ~1);
  scorePairs(block, bankNorms, q, g, b0, end, dim, k, topDist, topIndex);
  if (end < b1) scoreSingle(block, bankNorms, q, g, b0, end, dim, k, topDist, topIndex);
}

/** Bank rows [b0, to) two at a time: eight accumulators, six loads per eight multiply-adds. */
function scorePairs(
  block: Float64Array,
  bankNorms: Float64Array,
  q: Float64Array,
  g: number,
  b0: number,
  to: number,
  dim: number,
  k: number,
  topDist: Float64Array,
  topIndex: Int32Array,
): void {
  const o0 = g * dim;
  const o1 = o0 + dim;
  const o2 = o1 + dim;
  const o3 = o2 + dim;
  for (let b = b0; b < to; b += 2) {
    const oa = (b - b0) * dim;
    const oc = oa + dim;
    let a0 = 0;
    let a1 = 0;
    let a2 = 0;
    let a3 = 0;
    let c0 = 0;
    let c1 = 0;
    let c2 = 0;
    let c3 = 0;
    for (let j = 0; j < dim; j++) {
      const va = block[oa + j]!;
      const vc = block[oc + j]!;
      const x0 = q[o0 + j]!;
      const x1 = q[o1 + j]!;
      const x2 = q[o2 + j]!;
      const x3 = q[o3 + j]!;
      a0 += x0 * va;
      a1 += x1 * va;
      a2 += x2 * va;
      a3 += x3 * va;
      c0 += x0 * vc;
      c1 += x1 * vc;
      c2 += x2 * vc;
      c3 += x3 * vc;
    }
    const na = bankNorms[b]!;
    const nc = bankNorms[b + 1]!;
    offer(topDist, topIndex, g * k, k, na - 2 * a0, b);
    offer(topDist, topIndex, g * k, k, nc - 2 * c0, b + 1);
    offer(topDist, topIndex, (g + 1) * k, k, na - 2 * a1, b);
    offer(topDist, topIndex, (g + 1) * k, k, nc - 2 * c1, b + 1);
    offer(topDist, topIndex, (g + 2) * k, k, na - 2 * a2, b);
    offer(topDist, topIndex, (g + 2) * k, k, nc - 2 * c2, b + 1);
    offer(topDist, topIndex, (g + 3) * k, k, na - 2 * a3, b);
    offer(topDist, topIndex, (g + 3) * k, k, nc - 2 * c3, b + 1);
  }
}

/** The last bank row `b` of an odd-sized block. */
function scoreSingle(
  block: Float64Array,
  bankNorms: Float64Array,
  q: Float64Array,
  g: number,
  b0: number,
  b: number,
  dim: number,
  k: number,
  topDist: Float64Array,
  topIndex: Int32Array,
): void {
  const o0 = g * dim;
  const o1 = o0 + dim;
  const o2 = o1 + dim;
  const o3 = o2 + dim;
  const ob = (b - b0) * dim;
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  for (let j = 0; j < dim; j++) {
    const v = block[ob + j]!;
    s0 += q[o0 + j]! * v;
    s1 += q[o1 + j]! * v;
    s2 += q[o2 + j]! * v;
    s3 += q[o3 + j]! * v;
  }
  const nb = bankNorms[b]!;
  offer(topDist, topIndex, g * k, k, nb - 2 * s0, b);
  offer(topDist, topIndex, (g + 1) * k, k, nb - 2 * s1, b);
  offer(topDist, topIndex, (g + 2) * k, k, nb - 2 * s2, b);
  offer(topDist, topIndex, (g + 3) * k, k, nb - 2 * s3, b);
}

/** Inserts (dist, index) into the ascending list at `o` if it beats the current k-th. */
function offer(
  topDist: Float64Array,
  topIndex: Int32Array,
  o: number,
  k: number,
  dist: number,
  index: number,
): void {
  // Strict comparison: bank rows arrive in increasing index, so ties keep the lower index.
  if (!(dist < topDist[o + k - 1]!)) return;
  let i = k - 1;
  while (i > 0 && topDist[o + i - 1]! > dist) {
    topDist[o + i] = topDist[o + i - 1]!;
    topIndex[o + i] = topIndex[o + i - 1]!;
    i--;
  }
  topDist[o + i] = dist;
  topIndex[o + i] = index;
}
