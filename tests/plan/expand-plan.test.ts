import { describe, expect, it } from 'vitest';
import { canonicalJson } from '../../runner/config/canonical-json.ts';
import { loadExperiment } from '../../runner/config/load-experiment.ts';
import type { ExperimentConfig } from '../../runner/config/types.ts';
import { expandPlan } from '../../runner/plan/expand-plan.ts';
import type { JobSpec } from '../../runner/plan/job-spec.ts';
import { PlanTooLargeError } from '../../runner/plan/plan-size.ts';

async function plan(file: string, overrides: string[] = []): Promise<JobSpec[]> {
  const result = await loadExperiment(file, { overrides });
  if (!result.ok) throw new Error(`${file} should load: ${JSON.stringify(result.errors)}`);
  return expandPlan(result.config, result.baseDir);
}

function idsOf(jobs: JobSpec[], kind: JobSpec['kind'], method?: string): string[] {
  return jobs
    .filter((j) => j.kind === kind && (method === undefined || j.method.name === method))
    .map((j) => j.id);
}

describe('expandPlan on the demo', () => {
  it('lists train jobs first, then one evaluate job per train job', async () => {
    const jobs = await plan('configs/demo.yaml');
    // 2 datasets × 2 dims × 3 seeds contrastive = 12; pca, sfa: 2 × 2 (seed-free) = 8; raw: 2.
    expect(idsOf(jobs, 'train')).toHaveLength(22);
    expect(idsOf(jobs, 'evaluate')).toHaveLength(22);
    expect(jobs.findIndex((j) => j.kind === 'evaluate')).toBe(22);
    const trainIds = new Set(idsOf(jobs, 'train'));
    for (const job of jobs) {
      expect(job.id).toMatch(/^[0-9a-f]{16}$/);
      if (job.kind === 'evaluate') expect(trainIds.has(job.trainId)).toBe(true);
    }
  });

  it('labels object-valued axes by their source and leaves out axes a method ignores', async () => {
    const jobs = await plan('configs/demo.yaml');
    const contrastive = jobs.filter((j) => j.kind === 'train' && j.method.name === 'contrastive');
    expect(new Set(contrastive.map((j) => canonicalJson(j.setting)))).toEqual(
      new Set([
        '{"data":"linear-gaussian","dim":4}',
        '{"data":"linear-gaussian","dim":8}',
        '{"data":"rover-maze","dim":4}',
        '{"data":"rover-maze","dim":8}',
      ]),
    );
    const raw = jobs.filter((j) => j.kind === 'train' && j.method.name === 'raw');
    expect(raw.map((j) => j.setting)).toEqual([
      { data: 'linear-gaussian' },
      { data: 'rover-maze' },
    ]);
    const rover = contrastive.find((j) => j.setting.data === 'rover-maze');
    // The axis block is merged over the file's `data:` (episodes 120 come from the file).
    expect(rover?.kind === 'train' && rover.data).toMatchObject({
      source: 'rover-maze',
      layout: 'open-hall',
      episodes: 120,
    });
  });
});

describe('job ids', () => {
  it('do not depend on key order, comments, quoting or number spelling', async () => {
    const a = await plan('tests/fixtures/config/good/ordered.yaml');
    const b = await plan('tests/fixtures/config/good/reordered.yaml');
    expect(b.map((j) => j.id).sort()).toEqual(a.map((j) => j.id).sort());
    // Train: contrastive 2 weights × 2 seeds, pca 1, random 2 seeds = 7; each × 2 ridges evaluated.
    expect(a).toHaveLength(7 + 7 * 2);
  });

  it('change for trained methods when training settings change, not for pca', async () => {
    const before = await plan('configs/demo.yaml');
    const after = await plan('configs/demo.yaml', ['train.steps=301', 'encoder.widths=[32]']);
    expect(idsOf(after, 'train', 'pca')).toEqual(idsOf(before, 'train', 'pca'));
    expect(idsOf(after, 'train', 'raw')).toEqual(idsOf(before, 'train', 'raw'));
    expect(idsOf(after, 'evaluate', 'sfa')).toEqual(idsOf(before, 'evaluate', 'sfa'));
    const changed = idsOf(after, 'train', 'contrastive');
    expect(changed.filter((id) => idsOf(before, 'train').includes(id))).toEqual([]);
  });

  it('change only evaluate jobs when only eval settings change (trained encoders are reused)', async () => {
    const before = await plan('configs/demo.yaml');
    const after = await plan('configs/demo.yaml', ['eval.queries=50']);
    expect(idsOf(after, 'train')).toEqual(idsOf(before, 'train'));
    expect(idsOf(after, 'evaluate').filter((id) => idsOf(before, 'evaluate').includes(id))).toEqual(
      [],
    );
  });

  it('ignore table labels and the experiment name (they do not change any output)', async () => {
    const before = await plan('configs/demo.yaml');
    const after = await plan('configs/demo.yaml', [
      'name=renamed',
      'methods=[{name: contrastive, label: ours}, pca, sfa, raw]',
    ]);
    expect(after.map((j) => j.id)).toEqual(before.map((j) => j.id));
  });
});

describe('paired axes and limits', () => {
  it('varies a together group as one axis', async () => {
    const jobs = await plan('configs/demo.yaml', [
      'methods=[contrastive]',
      'sweep.axes={}',
      'sweep.seeds=1',
      'sweep.together=[{train.weight: [0.1, 1, 10], train.scale: [1, 2, 4]}]',
    ]);
    expect(jobs.filter((j) => j.kind === 'train').map((j) => j.setting)).toEqual([
      { 'train.weight': 0.1, 'train.scale': 1 },
      { 'train.weight': 1, 'train.scale': 2 },
      { 'train.weight': 10, 'train.scale': 4 },
    ]);
  });

  it('refuses a plan above run.maxJobs before building any job', async () => {
    const result = await loadExperiment('configs/demo.yaml');
    if (!result.ok) throw new Error('demo must load');
    const config: ExperimentConfig = {
      ...result.config,
      run: { ...result.config.run, maxJobs: 43 },
    };
    expect(() => expandPlan(config, result.baseDir)).toThrow(PlanTooLargeError);
    expect(
      expandPlan({ ...config, run: { ...config.run, maxJobs: 44 } }, result.baseDir),
    ).toHaveLength(44);
  });
});
