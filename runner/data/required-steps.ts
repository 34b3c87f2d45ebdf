/**
 * The shortest episode the evaluation can use, from its settings: an h-step forecast needs
 * a start and the step h later (h + 1 steps), a bridge with T waypoints needs both ends
 * (T + 2 steps). Pass the result to loadDataset as `minSteps`.
 */
import type { EvalConfig } from '../config/types.ts';

/**
 * Steps every episode must have for `evalConfig`; at least 2 (one positive pair). Horizons
 * count when a suite that forecasts runs (forecast, calibration), waypoints when one that
 * bridges runs (bridge, calibration); without `suites`, both count.
 */
export function requiredSteps(
  evalConfig: Pick<EvalConfig, 'horizons' | 'waypoints'> & Partial<Pick<EvalConfig, 'suites'>>,
): number {
  const runs = (...names: EvalConfig['suites']): boolean =>
    evalConfig.suites === undefined || names.some((n) => evalConfig.suites?.includes(n));
  const horizons = runs('forecast', 'calibration') ? evalConfig.horizons : [];
  const waypoints = runs('bridge', 'calibration') ? evalConfig.waypoints : [];
  return Math.max(2, ...horizons.map((h) => h + 1), ...waypoints.map((t) => t + 2));
}
