/**
 * CONTRACT — one tidy metric value as stored in results and aggregated by reports.
 * Metric names are stable and documented in docs/metrics.md (owned by evaluation).
 */
export interface MetricRow {
  /** Suite that produced it: 'forecast' | 'bridge' | 'calibration' | 'assumptions' | 'planning' | 'training'. */
  suite: string;
  /** Stable name, e.g. forecast_nmse, bridge_nmse, bridge_nmse_oracle, coverage_90, planning_success. */
  metric: string;
  /** Horizon, waypoint count or distance bin; 'all' when the metric has no level. */
  level: number | string;
  /** Transition source when relevant ('critic' | 'fitted' | 'true'), else ''. */
  source: string;
  value: number;
  /** Number of tasks behind the value, when it is an average. */
  n?: number;
  /**
   * What one transition of `level` counts (added by evaluation, optional): environment
   * 'step's, or 'jump's (one geometric offset each, MATH.md §2). See docs/metrics.md.
   */
  unit?: 'step' | 'jump';
}
