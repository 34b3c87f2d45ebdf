/**
 * Shape checks for files read back from a results directory. Files may come from an older
 * Midpath, a half-finished copy or a hand edit, so readers check the fields they rely on
 * rather than trusting a cast.
 */
import type { JobResult, PlanFile } from './result.ts';

const STATUSES = new Set(['done', 'failed', 'diverged']);
const KINDS = new Set(['train', 'evaluate']);

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** Returns a description of the first missing or wrong field, or null when `value` is a JobResult. */
export function describeResultFault(value: unknown): string | null {
  if (!isObject(value)) return 'expected a JSON object';
  if (typeof value.id !== 'string') return 'expected a string "id"';
  if (typeof value.kind !== 'string' || !KINDS.has(value.kind)) {
    return `expected "kind" train or evaluate, got ${JSON.stringify(value.kind)}`;
  }
  if (typeof value.status !== 'string' || !STATUSES.has(value.status)) {
    return `expected "status" done, failed or diverged, got ${JSON.stringify(value.status)}`;
  }
  if (!isObject(value.spec)) return 'expected an object "spec"';
  if (!Array.isArray(value.metrics)) return 'expected an array "metrics"';
  if (!isObject(value.provenance)) return 'expected an object "provenance"';
  return null;
}

/** Narrows a parsed JSON value to JobResult. */
export function isJobResult(value: unknown): value is JobResult {
  return describeResultFault(value) === null;
}

/** Returns a description of the first missing or wrong field, or null when `value` is a PlanFile. */
export function describePlanFault(value: unknown): string | null {
  if (!isObject(value)) return 'expected a JSON object';
  if (typeof value.experiment !== 'string') return 'expected a string "experiment"';
  if (!Array.isArray(value.jobs)) return 'expected an array "jobs"';
  const bad = value.jobs.findIndex(
    (job) => !isObject(job) || typeof job.id !== 'string' || !KINDS.has(String(job.kind)),
  );
  return bad >= 0 ? `jobs[${bad}]: expected an object with a string "id" and a "kind"` : null;
}

/** Narrows a parsed JSON value to PlanFile. */
export function isPlanFile(value: unknown): value is PlanFile {
  return describePlanFault(value) === null;
}
