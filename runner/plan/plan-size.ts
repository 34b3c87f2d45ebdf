import { countJobs, type JobCount } from '../config/count-jobs.ts';
import type { ExperimentConfig } from '../config/types.ts';

export { countJobs, type JobCount };

/** Thrown by expandPlan for a config whose plan exceeds `run.maxJobs` (loadExperiment reports it first, located). */
export class PlanTooLargeError extends Error {
  readonly code = 'too-many-jobs';

  constructor(
    readonly count: JobCount,
    readonly limit: number,
  ) {
    super(`expected at most run.maxJobs = ${limit} jobs, got ${count.total}`);
    this.name = 'PlanTooLargeError';
  }
}

/** Counts the plan's jobs without building them and refuses one larger than `run.maxJobs`. */
export function assertPlanSize(config: ExperimentConfig): JobCount {
  const count = countJobs(config);
  if (count.total > config.run.maxJobs) throw new PlanTooLargeError(count, config.run.maxJobs);
  return count;
}
