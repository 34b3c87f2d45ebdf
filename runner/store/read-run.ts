/**
 * Reads a results directory: plan.json and every jobs/<id>/result.json. Missing or corrupt
 * files never stop the read; they are listed in `problems` so a report can say what is
 * missing instead of failing. Readers may run while a runner writes: result files appear
 * atomically, and temporary files are skipped.
 */
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { isSafeJobId, jobsDirOf, planPathOf, resultPathOf } from './job-paths.ts';
import { describePlanFault, describeResultFault } from './check-result.ts';
import type { JobResult, PlanFile } from './result.ts';
import type { StoreProblem } from './store-error.ts';

/** What `readRun` finds: the plan (null when absent or corrupt), the results, and problems. */
export interface RunContents {
  plan: PlanFile | null;
  /** In plan order when there is a plan, then any results the plan does not list, by id. */
  results: JobResult[];
  problems: StoreProblem[];
}

// Synchronous reads: for thousands of small files they are several times faster than
// fs/promises (no thread-pool round trip per file), and a read takes microseconds.
function readJson(
  path: string,
  problems: StoreProblem[],
  describeFault: (value: unknown) => string | null,
  missingCode: StoreProblem['code'] | null,
): unknown {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    const missing = (error as NodeJS.ErrnoException).code === 'ENOENT';
    if (missing && missingCode === null) return undefined; // no result yet: not a problem
    problems.push({
      code: missing && missingCode !== null ? missingCode : 'store-corrupt-file',
      file: path,
      message: missing
        ? 'no plan.json; run `midpath run FILE --out DIR` to create it'
        : String(error),
    });
    return undefined;
  }
  try {
    const value: unknown = JSON.parse(text);
    const fault = describeFault(value);
    if (fault === null) return value;
    problems.push({
      code: 'store-corrupt-file',
      file: path,
      message: `${fault}; delete the file and run again to redo it`,
    });
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    problems.push({
      code: 'store-corrupt-file',
      file: path,
      message: `not valid JSON (${reason}); delete the file and run again to redo it`,
    });
  }
  return undefined;
}

/** Lists the job ids that have a directory under jobs/ (sorted). */
export function listJobDirs(dir: string): string[] {
  const jobsDir = jobsDirOf(dir);
  if (!existsSync(jobsDir)) return [];
  return readdirSync(jobsDir, { withFileTypes: true })
    .filter((entry) => entry.isDirectory() && isSafeJobId(entry.name))
    .map((entry) => entry.name)
    .sort();
}

function readResult(dir: string, id: string, problems: StoreProblem[]): JobResult | null {
  const path = resultPathOf(dir, id);
  const value = readJson(path, problems, describeResultFault, null) as JobResult | undefined;
  if (value === undefined) return null;
  if (value.id !== id) {
    problems.push({
      code: 'store-mismatched-id',
      file: path,
      message: `expected id ${id} (the directory name), got ${value.id}; the file was moved by hand, delete it and run again`,
    });
    return null;
  }
  return value;
}

/**
 * Reads plan.json and every jobs/*\/result.json under `dir`. Never throws for missing or
 * corrupt files; they are reported in `problems`.
 */
export function readRun(dir: string): Promise<RunContents> {
  return new Promise((settle) => settle(readRunSync(dir)));
}

/** The synchronous form of `readRun`. */
export function readRunSync(dir: string): RunContents {
  const problems: StoreProblem[] = [];
  if (!existsSync(dir)) {
    problems.push({
      code: 'store-not-a-run',
      file: dir,
      message: 'no such directory; give the --out directory of a `midpath run`',
    });
    return { plan: null, results: [], problems };
  }
  const plan =
    (readJson(planPathOf(dir), problems, describePlanFault, 'store-missing-plan') as
      PlanFile | undefined) ?? null;
  const found = new Map<string, JobResult>();
  let ids: string[] = [];
  try {
    ids = listJobDirs(dir);
  } catch (error) {
    const file = jobsDirOf(dir);
    problems.push({
      code: 'store-not-a-run',
      file,
      message: `cannot list job directories (${String(error)}); jobs/ must be a directory`,
    });
  }
  for (const id of ids) {
    const result = readResult(dir, id, problems);
    if (result) found.set(id, result);
  }
  const ordered: JobResult[] = [];
  for (const job of plan?.jobs ?? []) {
    const result = found.get(job.id);
    if (result) ordered.push(result);
    found.delete(job.id);
  }
  ordered.push(...[...found.values()].sort((a, b) => a.id.localeCompare(b.id)));
  return { plan, results: ordered, problems };
}
