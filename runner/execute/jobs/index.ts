/**
 * The job-kind → handler map (STYLE.md §7): adding a kind of job means one handler file and
 * one case here; the switch is exhaustive, so the compiler names a kind left out.
 */
import type { JobHandler } from '../job-handler.ts';
import type { JobKind, JobSpec } from '../../plan/job-spec.ts';
import { evaluateJob } from './evaluate-job.ts';
import { trainJob } from './train-job.ts';

/** The handler that runs jobs of `kind`. */
export function handlerFor(kind: JobKind): JobHandler {
  switch (kind) {
    case 'train':
      return trainJob as JobHandler;
    case 'evaluate':
      return evaluateJob as JobHandler;
  }
}

/** Runs `spec` with the handler of its kind (the narrowing keeps each handler's spec type). */
export type HandlerLookup = (kind: JobSpec['kind']) => JobHandler;
