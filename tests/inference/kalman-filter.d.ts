// Minimal typings for the parts of the `kalman-filter` package (v2, CommonJS, untyped) that
// the Kalman-oracle tests use. Matrices are number[][]; means are column matrices [dim, 1].
declare module 'kalman-filter' {
  type Dense = number[][];
  type MatrixOrFn = Dense | ((opts: { index: number }) => Dense);

  export class State {
    constructor(options: { mean: Dense; covariance: Dense; index?: number });
    mean: Dense;
    covariance: Dense;
    index: number;
  }

  export interface KalmanFilterOptions {
    observation: { dimension: number; stateProjection: MatrixOrFn; covariance: MatrixOrFn };
    dynamic: {
      dimension: number;
      transition: MatrixOrFn;
      covariance: MatrixOrFn;
      init: { mean: Dense; covariance: Dense; index?: number };
    };
    logger?: { info: () => void; debug: () => void; warn: () => void; error: () => void };
  }

  export class KalmanFilter {
    constructor(options: KalmanFilterOptions);
    predict(options: { previousCorrected?: State | null; index?: number }): State;
    correct(options: { predicted: State; observation: Dense }): State;
    getGain(options: { predicted: State }): Dense;
    asymptoticGain(options?: { tolerance?: number }): Dense;
  }
}
