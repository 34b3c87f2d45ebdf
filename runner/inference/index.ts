/**
 * The closed-form inference stage (MATH.md §2–3): transition models, forecasts, bridges
 * and decoding. Implements the contract in api.ts; see docs/inference.md.
 */
import type { InferenceApi } from './api.ts';
import { solveBridge } from './bridge.ts';
import { fitTransition } from './fit-transition.ts';
import { forecast } from './forecast.ts';
import { criticTransition } from './transition.ts';

export type { BridgePosterior, Gaussian, InferenceApi, TransitionModel } from './api.ts';
export { prepareBridge, solveBridge, type BridgeSolver } from './bridge.ts';
export { fitTransition, type FitTransitionOptions } from './fit-transition.ts';
export { forecast, forecastBatch, jumpMoments } from './forecast.ts';
export { knnDecode } from './knn-decode.ts';
export { DEFAULT_MAX_CONDITION, regulariseCovariance } from './regularise.ts';
export { fitRidgeProbe, type RidgeProbe } from './ridge-probe.ts';
export { criticTransition, trueTransition } from './transition.ts';
export { NumericError, type NumericErrorCode } from '../numeric/linalg/errors.ts';

/** The contract object of api.ts, for callers that take the API as a value. */
export const inferenceApi: InferenceApi = {
  criticTransition,
  fitTransition,
  forecast,
  solveBridge,
};
