/**
 * The shortest episode the evaluation can use, from its settings: an h-step forecast needs
 * a start and the step h later (h + 1 steps), a bridge with T waypoints needs both ends
 * (T + 2 steps). Pass the result to loadDataset as `minSteps`.
 */
import type { EvalConfig } from '../config/types.ts';

/** Steps every episode must have for `evalConfig`; at least 2 (one positive pair). */
export function requiredSteps(evalConfig: Pick<EvalConfig, 'horizons' | 'waypoints'>): number {
  const forecast = Math.max(0, ...evalConfig.horizons) + 1;
  const bridge = Math.max(0, ...evalConfig.waypoints) + 2;
  return Math.max(2, forecast, bridge);
}
