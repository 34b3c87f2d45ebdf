import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadExperiment } from '../../runner/config/load-experiment.ts';
import type { ExperimentConfig, MethodName } from '../../runner/config/types.ts';
import { expandPlan } from '../../runner/plan/expand-plan.ts';

/**
 * What we count (the rule docs/config.md states): jobs are the product of the axis sizes (a
 * `together` group counts once, with its common length) times the seeds times the methods,
 * for the contrastive encoder. Methods that ignore part of the config get one job for all
 * values they ignore: pca and sfa ignore the seed, encoder.* and train.*; random ignores
 * encoder.* and train.*; raw also ignores dim. Axes over eval.* multiply evaluate jobs only.
 * This table is written here from that rule, independently of runner/config/method-inputs.ts.
 */
const USES: Record<string, { seed: boolean; dim: boolean; trains: boolean }> = {
  contrastive: { seed: true, dim: true, trains: true },
  autoencoder: { seed: true, dim: true, trains: true },
  random: { seed: true, dim: true, trains: false },
  pca: { seed: false, dim: true, trains: false },
  sfa: { seed: false, dim: true, trains: false },
  raw: { seed: false, dim: false, trains: false },
};

const VALUES: Record<string, fc.Arbitrary<unknown[]>> = {
  dim: fc.uniqueArray(fc.integer({ min: 1, max: 64 }), { minLength: 1, maxLength: 3 }),
  'train.discount': fc.subarray([0.5, 0.8, 0.9, 0.99], { minLength: 1, maxLength: 3 }),
  'train.weight': fc.uniqueArray(fc.integer({ min: 0, max: 50 }), { minLength: 1, maxLength: 3 }),
  'encoder.widths': fc.uniqueArray(
    fc.array(fc.integer({ min: 1, max: 64 }), { minLength: 1, maxLength: 2 }),
    {
      minLength: 1,
      maxLength: 3,
      selector: (v) => JSON.stringify(v),
    },
  ),
  'data.steps': fc.uniqueArray(fc.integer({ min: 2, max: 99 }), { minLength: 1, maxLength: 3 }),
  data: fc.subarray(
    [{ source: 'lorenz' }, { source: 'rover-maze', layout: 'long-corridors' }, { episodes: 9 }],
    {
      minLength: 1,
    },
  ),
  'eval.ridge': fc.subarray([0.001, 0.01, 0.1], { minLength: 1 }),
  'eval.queries': fc.uniqueArray(fc.integer({ min: 1, max: 500 }), { minLength: 1, maxLength: 3 }),
};

interface Sweep {
  axes: Record<string, unknown[]>;
  together: Record<string, unknown[]>[];
  seeds: number | number[];
  methods: MethodName[];
}

/** Random sweeps: some paths as axes, some paired (truncated to a common length). */
const sweeps: fc.Arbitrary<Sweep> = fc
  .record({
    // `data` and `data.steps` overlap (an error), so at most one of them is drawn.
    paths: fc
      .shuffledSubarray(Object.keys(VALUES), { maxLength: 4 })
      .filter((p) => !(p.includes('data') && p.includes('data.steps'))),
    pairCount: fc.integer({ min: 0, max: 2 }),
    seeds: fc.oneof(
      fc.integer({ min: 1, max: 3 }),
      fc.uniqueArray(fc.integer({ min: 0, max: 20 }), { minLength: 1, maxLength: 3 }),
    ),
    methods: fc.subarray(Object.keys(USES) as MethodName[], { minLength: 1 }),
  })
  .chain(({ paths, pairCount, seeds, methods }) =>
    fc.tuple(...paths.map((p) => VALUES[p] as fc.Arbitrary<unknown[]>)).map((lists) => {
      const sweep: Sweep = { axes: {}, together: [], seeds, methods };
      const paired = Math.min(pairCount, Math.floor(paths.length / 2)) * 2;
      for (let i = 0; i < paired; i += 2) {
        const n = Math.min(lists[i]?.length ?? 0, lists[i + 1]?.length ?? 0);
        sweep.together.push({
          [paths[i] ?? '']: lists[i]?.slice(0, n) ?? [],
          [paths[i + 1] ?? '']: lists[i + 1]?.slice(0, n) ?? [],
        });
      }
      paths.slice(paired).forEach((p, k) => (sweep.axes[p] = lists[paired + k] ?? []));
      return sweep;
    }),
  );

function expectedCounts(sweep: Sweep): { train: number; evaluate: number } {
  const groups = [...Object.entries(sweep.axes).map(([p, v]) => ({ [p]: v })), ...sweep.together];
  const seedCount = typeof sweep.seeds === 'number' ? sweep.seeds : sweep.seeds.length;
  let train = 0;
  let evaluate = 0;
  for (const method of sweep.methods) {
    const uses = USES[method] ?? { seed: true, dim: true, trains: true };
    const feedsTraining = (p: string): boolean =>
      p.startsWith('data') ||
      (p === 'dim' && uses.dim) ||
      ((p.startsWith('train') || p.startsWith('encoder')) && uses.trains);
    let t = uses.seed ? seedCount : 1;
    let e = 1;
    for (const group of groups) {
      const paths = Object.keys(group);
      const size = Object.values(group)[0]?.length ?? 0;
      if (paths.some(feedsTraining)) t *= size;
      else if (paths.some((p) => p.startsWith('eval'))) e *= size;
    }
    train += t;
    evaluate += t * e;
  }
  return { train, evaluate };
}

/** The same value with mapping keys in reverse order at every depth. */
function reverseKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(reverseKeys);
  if (typeof value !== 'object' || value === null) return value;
  return Object.fromEntries(
    Object.entries(value)
      .reverse()
      .map(([k, v]) => [k, reverseKeys(v)]),
  );
}

let base: ExperimentConfig;
beforeAll(async () => {
  const result = await loadExperiment('configs/demo.yaml');
  if (!result.ok) throw new Error('configs/demo.yaml must load');
  base = result.config;
});

function withSweep(sweep: Sweep): ExperimentConfig {
  return {
    ...structuredClone(base),
    methods: sweep.methods.map((name) => ({ name, label: name })),
    sweep: { seeds: sweep.seeds, axes: sweep.axes, together: sweep.together },
  };
}

describe('expandPlan properties (fast-check)', () => {
  it('job count = product of axis sizes × seeds per method, paired axes counting once', () => {
    fc.assert(
      fc.property(sweeps, (sweep) => {
        const jobs = expandPlan(withSweep(sweep), '/base');
        const expected = expectedCounts(sweep);
        expect(jobs.filter((j) => j.kind === 'train')).toHaveLength(expected.train);
        expect(jobs.filter((j) => j.kind === 'evaluate')).toHaveLength(expected.evaluate);
        expect(new Set(jobs.map((j) => j.id)).size).toBe(jobs.length);
      }),
      { numRuns: 60 },
    );
  });

  it('contrastive only: evaluate jobs = Π axis sizes × seeds (the headline rule)', () => {
    fc.assert(
      fc.property(sweeps, (sweep) => {
        const only: Sweep = { ...sweep, methods: ['contrastive'] };
        const sizes = [
          ...Object.values(only.axes),
          ...only.together.map((g) => Object.values(g)[0] ?? []),
        ];
        const product = sizes.reduce((n, v) => n * v.length, 1);
        const seedCount = typeof only.seeds === 'number' ? only.seeds : only.seeds.length;
        const jobs = expandPlan(withSweep(only), '/base');
        expect(jobs.filter((j) => j.kind === 'evaluate')).toHaveLength(product * seedCount);
      }),
      { numRuns: 40 },
    );
  });

  it('ids are stable: key order does not change them, and train jobs precede their evaluations', () => {
    fc.assert(
      fc.property(sweeps, (sweep) => {
        const config = withSweep(sweep);
        const jobs = expandPlan(config, '/base');
        const again = expandPlan(reverseKeys(config) as ExperimentConfig, '/base');
        // Axis order sets the listing order only; the set of ids must not change.
        expect(again.map((j) => j.id).sort()).toEqual(jobs.map((j) => j.id).sort());
        const seen = new Set<string>();
        for (const job of jobs) {
          if (job.kind === 'evaluate') expect(seen.has(job.trainId)).toBe(true);
          else expect([...seen].length).toBe(jobs.indexOf(job));
          seen.add(job.id);
        }
      }),
      { numRuns: 40 },
    );
  });
});
