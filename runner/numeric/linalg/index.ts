/** Dense linear-algebra kernels on row-major Float64Array matrices (see docs/inference.md). */
export { NumericError, type NumericErrorCode } from './errors.ts';
export { cholesky, choleskyInPlace, logDetFromCholesky } from './cholesky.ts';
export {
  solveLower,
  solveLowerTranspose,
  solveLowerColsInPlace,
  solveLowerTransposeColsInPlace,
  solveLowerRowsInPlace,
  solveLowerTransposeRowsInPlace,
  solveUpperRowsInPlace,
} from './triangular.ts';
export {
  addScaled,
  multiply,
  multiplyInto,
  multiplyTransA,
  multiplyTransB,
  multiplyTransBInto,
  symmetrizeInPlace,
  transpose,
} from './multiply.ts';
export { inverseFromCholesky, inverseSpd, logDetSpd, solveSpd, solveWithCholesky } from './spd.ts';
export { symmetricEigen } from './eigen.ts';
