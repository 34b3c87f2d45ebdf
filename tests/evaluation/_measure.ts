import { loadDataset } from '../../runner/data/load-dataset.ts';
import { evaluateRepresentation } from '../../runner/evaluation/evaluate.ts';
import { evalConfig, evalSpec, linearRepresentation } from './fixtures.ts';
import type { DataConfig } from '../../runner/config/types.ts';
const base: DataConfig = { source: 'linear-gaussian', seed: 0, episodes: 200, steps: 64, obsDim: 32, noise: 0.05, stateDim: 4, map: 'linear', layout: 'open-hall', image: 16, dt: 0, split: { train: 0.7, val: 0.1, test: 0.2 }, standardise: true };
for (const data of [base, { ...base, source: 'rover-maze' as const }]) {
  const ds = await loadDataset(data, '.', { minSteps: 9 });
  const rep = linearRepresentation(ds.obsDim, 16, 1);
  rep.critic = { A: { rows: 16, cols: 16, data: Float64Array.from({ length: 256 }, (_, i) => (i % 17 === 0 ? Math.SQRT2 : 0)) }, c: 1 };
  const cfg = evalConfig({ suites: ['forecast','bridge','calibration','assumptions','planning','projections'], horizons: [1,2,4,8], jumps: [1,2,4], waypoints: [1,3,7], queries: 200, subsample: 500, planning: { tasks: 60, budget: 3 } });
  const spec = evalSpec(cfg); (spec.train.train as any).discount = 0.9;
  const t0 = performance.now();
  const { metrics, artifacts } = await evaluateRepresentation(rep, ds, spec);
  console.log(data.source, 'test eps', ds.test.length, 'rows', metrics.length, 'ms', Math.round(performance.now() - t0));
  console.log((artifacts.diagnostics as any).notes);
  for (const m of metrics.filter(m => m.suite === 'planning')) console.log(m.metric, m.level, m.source, m.value.toFixed(3), m.n);
  console.log(metrics.filter(m => m.metric === 'bridge_nmse').map(m => `${m.source}/${m.level}: ${m.value.toFixed(3)} n=${m.n}`).join('; '));
}
