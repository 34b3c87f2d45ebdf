/** Held-out R² of a least-squares linear map (with intercept) from encodings to true states. */
import { Matrix, solve } from 'ml-matrix';
import type { Episode } from '../../runner/data/episode.ts';
import type { Representation } from '../../runner/training/representation.ts';

function design(rep: Representation, episodes: Episode[]): { z: Matrix; s: Matrix } {
  const rowsZ: number[][] = [];
  const rowsS: number[][] = [];
  for (const e of episodes) {
    const z = rep.encode(e.obs, e.steps);
    for (let t = 0; t < e.steps; t++) {
      rowsZ.push([1, ...Array.from(z.subarray(t * rep.dim, (t + 1) * rep.dim))]);
      rowsS.push(Array.from(e.state!.subarray(t * e.stateDim!, (t + 1) * e.stateDim!)));
    }
  }
  return { z: new Matrix(rowsZ), s: new Matrix(rowsS) };
}

/** R² = 1 − SSE/SST over all state coordinates, fitted on `train`, scored on `test` (common practice). */
export function heldOutR2(rep: Representation, train: Episode[], test: Episode[]): number {
  const a = design(rep, train);
  const b = design(rep, test);
  const gram = a.z.transpose().mmul(a.z).add(Matrix.eye(a.z.columns).mul(1e-6));
  const coef = solve(gram, a.z.transpose().mmul(a.s));
  const residual = b.s.clone().sub(b.z.mmul(coef));
  const means = b.s.mean('column');
  let sse = 0;
  let sst = 0;
  for (let i = 0; i < b.s.rows; i++) {
    for (let j = 0; j < b.s.columns; j++) {
      sse += residual.get(i, j) ** 2;
      sst += (b.s.get(i, j) - means[j]!) ** 2;
    }
  }
  return 1 - sse / sst;
}
