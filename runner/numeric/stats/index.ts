/**
 * Statistics for evaluation and reports: distributions, interval estimates, tests and
 * multiple-testing corrections. Pure functions on arrays.
 */
export { chiSquareCdf, chiSquarePdf, chiSquareQuantile, chiSquareTail } from './chi-square.ts';
export { normalCdf, normalPdf, normalQuantile } from './normal.ts';
export { studentTCdf, studentTPdf, studentTQuantile, studentTTail } from './student-t.ts';
export { betaIncomplete, gammaP, gammaQ, logGamma } from './special.ts';
export {
  interquartileMean,
  mean,
  quantileSorted,
  sampleVariance,
  summarise,
  type Summary,
} from './summary.ts';
export { bootstrapInterval, type BootstrapInterval, type BootstrapOptions } from './bootstrap.ts';
export { pairedTTest, welchTTest, type TTestResult } from './t-tests.ts';
export { wilsonInterval } from './wilson.ts';
export { kolmogorovPValue, kolmogorovSmirnov, type KsResult } from './kolmogorov-smirnov.ts';
export { benjaminiHochberg, holm } from './multiple-testing.ts';
export { mardia, type MardiaResult } from './mardia.ts';
export { henzeZirkler, type HenzeZirklerResult } from './henze-zirkler.ts';
export { whitenSample } from './whiten.ts';
