/**
 * The evaluation suites by name (STYLE.md §7): adding a suite is one file and one entry.
 * Each is a pure function of the evaluation context.
 */
import type { SuiteName } from '../../config/types.ts';
import type { EvalContext, SuiteOutput } from '../context.ts';
import { runAssumptionsSuite } from './assumptions.ts';
import { runBridgeSuite } from './bridge.ts';
import { runCalibrationSuite } from './calibration.ts';
import { runForecastSuite } from './forecast.ts';
import { runPlanningSuite } from './planning.ts';
import { runProjectionsSuite } from './projections.ts';

export type SuiteImpl = (context: EvalContext) => SuiteOutput;

/** Suite name → implementation. */
export const suites: Record<SuiteName, SuiteImpl> = {
  forecast: runForecastSuite,
  bridge: runBridgeSuite,
  calibration: runCalibrationSuite,
  assumptions: runAssumptionsSuite,
  planning: runPlanningSuite,
  projections: runProjectionsSuite,
};
