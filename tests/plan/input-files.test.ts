/**
 * Files a job reads enter its id by content: editing a data file, a plugin module or an
 * embeddings file reruns exactly the jobs that read it; touching, copying or moving the
 * experiment leaves every id as it was.
 */
import { cpSync, mkdtempSync, readFileSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadExperiment } from '../../runner/config/load-experiment.ts';
import { expandPlan } from '../../runner/plan/expand-plan.ts';
import { assertInputFilesUnchanged } from '../../runner/plan/input-files.ts';
import type { JobSpec, TrainJobSpec } from '../../runner/plan/job-spec.ts';

async function plan(file: string): Promise<JobSpec[]> {
  const result = await loadExperiment(file);
  if (!result.ok) throw new Error(`${file} should load: ${JSON.stringify(result.errors)}`);
  return expandPlan(result.config, result.baseDir);
}

const trains = (jobs: JobSpec[]): TrainJobSpec[] =>
  jobs.filter((j): j is TrainJobSpec => j.kind === 'train');
const idsByMethod = (jobs: JobSpec[]): Record<string, string[]> => {
  const out: Record<string, string[]> = {};
  for (const job of jobs) (out[`${job.kind}:${job.method.name}`] ??= []).push(job.id);
  return out;
};

/** A temporary experiment: a config reading `loading-bay.csv`, an embeddings file and a plugin. */
function experimentDir(): string {
  const dir = mkdtempSync(join(tmpdir(), 'midpath-inputs-'));
  cpSync('tests/fixtures/data/good.csv', join(dir, 'loading-bay.csv'));
  cpSync('configs/examples/plugins/residual-encoder.js', join(dir, 'encoder.js'));
  writeFileSync(
    join(dir, 'experiment.yaml'),
    [
      'name: loading-bay',
      'data:',
      '  source: file',
      '  split: { train: 0.5, val: 0.17, test: 0.33 }',
      '  file: { path: loading-bay.csv, features: [x1, x2, x3], state: [pos] }',
      'encoder: { kind: plugin, plugin: ./encoder.js }',
      'dim: 2',
      'methods: [contrastive, pca]',
      'sweep: { seeds: 2 }',
      '',
    ].join('\n'),
  );
  return dir;
}

describe('input files in job ids', () => {
  it('records the SHA-256 of the data file a job reads', async () => {
    const jobs = await plan('configs/examples/user-file.yaml');
    for (const job of trains(jobs)) {
      // Digest of tests/fixtures/data/good.csv as printed by GNU coreutils sha256sum.
      expect(job.inputFiles).toEqual({
        '../../tests/fixtures/data/good.csv':
          '7a374b09dc16c292dd2c76cbd041cb5e9d45e15b80e038944c795b7ed5661c75',
      });
    }
  });

  it('keeps ids when a file is touched or the experiment is copied elsewhere', async () => {
    const dir = experimentDir();
    const before = idsByMethod(await plan(join(dir, 'experiment.yaml')));
    utimesSync(join(dir, 'loading-bay.csv'), new Date(), new Date(2030, 0, 1));
    writeFileSync(join(dir, 'encoder.js'), readFileSync(join(dir, 'encoder.js')));
    expect(idsByMethod(await plan(join(dir, 'experiment.yaml')))).toEqual(before);
    const moved = mkdtempSync(join(tmpdir(), 'midpath-moved-'));
    cpSync(dir, moved, { recursive: true });
    rmSync(dir, { recursive: true });
    expect(idsByMethod(await plan(join(moved, 'experiment.yaml')))).toEqual(before);
  });

  it('changes the ids of exactly the jobs that read an edited file', async () => {
    const dir = experimentDir();
    const file = join(dir, 'experiment.yaml');
    const first = idsByMethod(await plan(file));
    expect(first['train:contrastive']).toHaveLength(2);
    expect(first['train:pca']).toHaveLength(1);

    // The plugin is read by training methods only: pca keeps its id.
    writeFileSync(
      join(dir, 'encoder.js'),
      `${readFileSync(join(dir, 'encoder.js'), 'utf8')}\n// v2\n`,
    );
    const second = idsByMethod(await plan(file));
    expect(second['train:pca']).toEqual(first['train:pca']);
    expect(second['evaluate:pca']).toEqual(first['evaluate:pca']);
    for (const id of second['train:contrastive'] ?? []) {
      expect(first['train:contrastive']).not.toContain(id);
    }
    for (const id of second['evaluate:contrastive'] ?? []) {
      expect(first['evaluate:contrastive']).not.toContain(id);
    }

    // One value of the data file edited: every job reads it.
    const csv = readFileSync(join(dir, 'loading-bay.csv'), 'utf8').split('\n');
    csv[1] = csv[1]!.replace(/,([-0-9.]+)$/, (_, v: string) => `,${Number(v) + 1}`);
    writeFileSync(join(dir, 'loading-bay.csv'), csv.join('\n'));
    const third = idsByMethod(await plan(file));
    for (const key of Object.keys(second)) {
      for (const id of third[key] ?? []) expect(second[key]).not.toContain(id);
    }
  });

  it('leaves jobs of built-in sources without input files', async () => {
    for (const job of trains(await plan('configs/demo.yaml'))) {
      expect(job.inputFiles).toBeUndefined();
    }
  });

  it('refuses to run a job whose file changed after planning, naming the file and the fix', async () => {
    const dir = experimentDir();
    const [job] = trains(await plan(join(dir, 'experiment.yaml')));
    expect(() => assertInputFilesUnchanged(job!.inputFiles, job!.baseDir)).not.toThrow();
    writeFileSync(join(dir, 'loading-bay.csv'), 'episode,step,x1\n');
    expect(() => assertInputFilesUnchanged(job!.inputFiles, job!.baseDir)).toThrow(
      /loading-bay\.csv changed after the plan was made .*run again/,
    );
  });
});
