/**
 * Adjusted p-values for families of tests (many dimensions, many settings).
 */

/**
 * Holm (1979) step-down adjustment, controls the family-wise error rate:
 * p̃_(i) = max_{j ≤ i} min(1, (m - j + 1) p_(j)). Returned in the input order.
 */
export function holm(pValues: ArrayLike<number>): Float64Array {
  const m = pValues.length;
  const order = sortedIndices(pValues);
  const out = new Float64Array(m);
  let running = 0;
  for (let rank = 0; rank < m; rank++) {
    const i = order[rank]!;
    running = Math.max(running, Math.min(1, (m - rank) * pValues[i]!));
    out[i] = running;
  }
  return out;
}

/**
 * Benjamini & Hochberg (1995) step-up adjustment, controls the false discovery rate:
 * p̃_(i) = min_{j ≥ i} min(1, m p_(j) / j). Returned in the input order.
 */
export function benjaminiHochberg(pValues: ArrayLike<number>): Float64Array {
  const m = pValues.length;
  const order = sortedIndices(pValues);
  const out = new Float64Array(m);
  let running = 1;
  for (let rank = m - 1; rank >= 0; rank--) {
    const i = order[rank]!;
    running = Math.min(running, (m * pValues[i]!) / (rank + 1));
    out[i] = running;
  }
  return out;
}

function sortedIndices(values: ArrayLike<number>): number[] {
  return Array.from({ length: values.length }, (_, i) => i).sort((a, b) => values[a]! - values[b]!);
}
