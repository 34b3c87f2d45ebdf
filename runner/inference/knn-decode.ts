/**
 * Decoding by exact nearest neighbours in a bank of encoded observations (MATH.md §4).
 * Squared distances use ‖a − b‖² = ‖a‖² + ‖b‖² − 2 a·b (the ‖q‖² term is constant per
 * query and dropped for ranking; common practice), with the products blocked: a block of
 * bank rows stays in cache while chunks of queries are scored against it by the
 * register-blocked kernel of numeric/linalg/multiply.ts.
 */
import { NumericError } from '../numeric/linalg/errors.ts';
import { multiplyTransBInto } from '../numeric/linalg/multiply.ts';
import { checkFinite, checkInteger, checkLength } from './validate.ts';

const BANK_BLOCK = 512;
const QUERY_CHUNK = 32;

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
  const topDist = new Float64Array(queryCount * k).fill(Infinity); // [queryCount, k] ascending
  const topIndex = new Int32Array(queryCount * k).fill(-1); // [queryCount, k]

  // Bank blocks and query chunks are copied into Float64Array scratch buffers, so the
  // product kernel is monomorphic (a Float32Array or Float64Array bank alike) and both
  // operands stay in cache; their dot products come from the shared blocked kernel.
  const block = new Float64Array(BANK_BLOCK * dim); // [BANK_BLOCK, dim]
  const chunk = new Float64Array(QUERY_CHUNK * dim); // [QUERY_CHUNK, dim]
  const dots = new Float64Array(QUERY_CHUNK * BANK_BLOCK); // [QUERY_CHUNK, BANK_BLOCK]
  for (let b0 = 0; b0 < bankCount; b0 += BANK_BLOCK) {
    const rows = Math.min(bankCount, b0 + BANK_BLOCK) - b0;
    for (let i = 0; i < rows * dim; i++) block[i] = bank[b0 * dim + i]!;
    for (let q0 = 0; q0 < queryCount; q0 += QUERY_CHUNK) {
      const count = Math.min(queryCount, q0 + QUERY_CHUNK) - q0;
      for (let i = 0; i < count * dim; i++) chunk[i] = queries[q0 * dim + i]!;
      multiplyTransBInto(chunk, block, dots, count, dim, rows);
      for (let u = 0; u < count; u++) {
        const o = (q0 + u) * k;
        for (let b = 0; b < rows; b++) {
          offer(topDist, topIndex, o, k, bankNorms[b0 + b]! - 2 * dots[u * rows + b]!, b0 + b);
        }
      }
    }
  }
  return topIndex;
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
