/**
 * The overview section: what the experiment is, what varied, how many jobs ended how, what
 * failed and why, compute time, and where the numbers came from (provenance).
 */
import { compareSettingValues, formatSettingValue } from '../aggregate.ts';
import { formatDuration } from '../../execute/progress-printer.ts';
import type { LoadedRun } from '../load-run.ts';
import type { JobResult } from '../../store/result.ts';

export interface OverviewModel {
  experiment: string;
  description: string;
  createdAt: string;
  varied: { name: string; values: string }[];
  methods: string;
  seeds: string;
  counts: {
    kind: string;
    planned: number;
    done: number;
    failed: number;
    diverged: number;
    pending: number;
  }[];
  failures: {
    id: string;
    kind: string;
    status: string;
    method: string;
    setting: string;
    seed: number;
    reason: string;
    attempts: number;
  }[];
  compute: { kind: string; jobs: number; seconds: string; hours: string }[];
  /** `readable`: the total for the header, e.g. "13.9 s" or "2.25 h". */
  computeTotal: { seconds: string; hours: string; readable: string };
  provenance: { name: string; values: string }[];
  problems: { code: string; file: string; message: string }[];
  /** Results of jobs the current plan no longer lists, left out of the report (0: none). */
  earlierResults: number;
}

function distinct(values: Iterable<string>): string[] {
  return [...new Set(values)].sort(compareSettingValues);
}

function describeSetting(setting: Record<string, unknown>): string {
  return Object.entries(setting)
    .map(([k, v]) => `${k}=${formatSettingValue(v)}`)
    .join(', ');
}

function countsOf(run: LoadedRun): OverviewModel['counts'] {
  const kinds = ['train', 'evaluate'] as const;
  return kinds.map((kind) => {
    const planned = (run.plan?.jobs ?? []).filter((j) => j.kind === kind).length;
    const mine = run.results.filter((r) => r.kind === kind);
    const by = (s: JobResult['status']): number => mine.filter((r) => r.status === s).length;
    return {
      kind,
      planned,
      done: by('done'),
      failed: by('failed'),
      diverged: by('diverged'),
      pending: Math.max(0, planned - mine.length),
    };
  });
}

function computeOf(results: readonly JobResult[]): Pick<OverviewModel, 'compute' | 'computeTotal'> {
  const seconds = (r: JobResult): number => {
    const s = r.provenance.wallSeconds;
    return typeof s === 'number' && Number.isFinite(s) ? s : 0;
  };
  const format = (s: number): { seconds: string; hours: string } => ({
    seconds: s.toFixed(1),
    hours: (s / 3600).toFixed(2),
  });
  const compute = (['train', 'evaluate'] as const).map((kind) => {
    const mine = results.filter((r) => r.kind === kind);
    return { kind, jobs: mine.length, ...format(mine.reduce((a, r) => a + seconds(r), 0)) };
  });
  const total = results.reduce((a, r) => a + seconds(r), 0);
  return { compute, computeTotal: { ...format(total), readable: formatDuration(total) } };
}

function provenanceOf(results: readonly JobResult[]): OverviewModel['provenance'] {
  const field = (
    name: string,
    pick: (r: JobResult) => unknown,
  ): { name: string; values: string } => ({
    name,
    values: distinct(results.map((r) => formatSettingValue(pick(r)) || 'unknown')).join(', '),
  });
  return [
    field('Midpath version', (r) => r.provenance.midpathVersion),
    field('git commit', (r) => r.provenance.gitCommit),
    field('Node.js', (r) => r.provenance.nodeVersion),
    field('backend', (r) => r.provenance.backend),
    field('hosts', (r) => r.provenance.hostname),
  ];
}

/** Builds the overview of a loaded run. */
export function buildOverview(run: LoadedRun): OverviewModel {
  const config = (run.plan?.config ?? {}) as { description?: unknown };
  const results = run.results;
  const varied = run.settingColumns.map((name) => ({
    name,
    values: distinct(
      results.map((r) => formatSettingValue(r.spec.setting[name]) || '(not set)'),
    ).join(', '),
  }));
  const failures = results
    .filter((r) => r.status !== 'done')
    .map((r) => ({
      id: r.id,
      kind: r.kind,
      status: r.status,
      method: r.spec.method.label,
      setting: describeSetting(r.spec.setting),
      seed: r.spec.seed,
      reason: r.error?.reason ?? 'no reason recorded',
      attempts: r.error?.attempts ?? 1,
    }));
  return {
    experiment: run.plan?.experiment ?? results[0]?.spec.experiment ?? run.dir,
    description: typeof config.description === 'string' ? config.description : '',
    createdAt: run.plan?.createdAt ?? '',
    varied,
    methods: run.methods.join(', '),
    seeds: distinct(results.map((r) => String(r.spec.seed))).join(', '),
    counts: countsOf(run),
    failures,
    ...computeOf(results),
    provenance: provenanceOf(results),
    problems: run.problems.map((p) => ({ code: p.code, file: p.file, message: p.message })),
    earlierResults: run.earlierResults,
  };
}
