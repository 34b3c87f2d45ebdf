/**
 * Generation time of the datasets the demo and the example configs use, printed as a table
 * beside a reference from the same run: the PRNG floor, i.e. the time to draw one standard
 * normal per stored value with the project's own generator (runner/numeric/random.ts) — no
 * generator can beat it by much, since each value carries at least one noise draw.
 * Target: every demo dataset in well under 5 s of CPU time (seconds, not minutes).
 *
 *   npx tsx bench/datasets.ts           demo + every example config (about 20 s)
 *   npx tsx bench/datasets.ts --quick   demo datasets only, one repetition
 */
import { cpus, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { listDataBlocks } from '../runner/cli/commands/inspect.ts';
import { loadExperiment } from '../runner/config/load-experiment.ts';
import type { DataConfig } from '../runner/config/types.ts';
import { loadDataset } from '../runner/data/load-dataset.ts';
import { createRng } from '../runner/numeric/random.ts';

const quick = process.argv.includes('--quick');
const repeats = quick ? 1 : 3;
const root = fileURLToPath(new URL('../', import.meta.url));

/** CPU seconds of one call (user + system), so neighbours on a shared machine don't count. */
async function cpuSeconds(fn: () => Promise<unknown>): Promise<number> {
  const t0 = process.cpuUsage();
  await fn();
  const used = process.cpuUsage(t0);
  return (used.user + used.system) / 1e6;
}

function prngFloor(values: number): number {
  const rng = createRng(1);
  const t0 = process.cpuUsage();
  let acc = 0;
  for (let i = 0; i < values; i++) acc += rng.normal();
  const used = process.cpuUsage(t0);
  if (Number.isNaN(acc)) throw new Error('unreachable: keeps the loop alive');
  return (used.user + used.system) / 1e6;
}

async function collect(): Promise<{ label: string; data: DataConfig; baseDir: string }[]> {
  const files = ['configs/demo.yaml'];
  if (!quick) {
    for (const n of [
      'linear-gaussian',
      'rover-maze',
      'swinging-lamp',
      'lorenz',
      'seattle-weather',
      'user-file',
    ]) {
      files.push(`configs/examples/${n}.yaml`);
    }
  }
  const out: { label: string; data: DataConfig; baseDir: string }[] = [];
  for (const file of files) {
    const loaded = await loadExperiment(file, { cwd: root });
    if (!loaded.ok) throw new Error(`${file} does not load: ${loaded.errors[0]?.message ?? ''}`);
    for (const block of listDataBlocks(loaded.config, loaded.baseDir)) {
      out.push({
        label: `${file.replace(/^configs\//, '')} ${block.data.source}`,
        data: block.data,
        baseDir: loaded.baseDir,
      });
    }
  }
  return out;
}

async function main(): Promise<void> {
  const rows: string[][] = [
    ['dataset', 'episodes×steps×dim', 'values', 'CPU s (best)', 'PRNG floor s', '× floor', '< 5 s'],
  ];
  await loadDataset((await collect())[0]!.data, root); // warm-up (JIT)
  for (const { label, data, baseDir } of await collect()) {
    let best = Infinity;
    let values = 0;
    let shape = '';
    for (let r = 0; r < repeats; r++) {
      let count = 0;
      const t = await cpuSeconds(async () => {
        const ds = await loadDataset(data, baseDir);
        const eps = [...ds.train, ...ds.val, ...ds.test];
        count = eps.reduce((n, e) => n + e.obs.length, 0);
        shape = `${eps.length}×${eps[0]?.steps ?? 0}×${ds.obsDim}`;
      });
      best = Math.min(best, t);
      values = count;
    }
    const floor = prngFloor(values);
    rows.push([
      label,
      shape,
      String(values),
      best.toFixed(3),
      floor.toFixed(3),
      (best / floor).toFixed(1),
      best < 5 ? 'yes' : 'NO',
    ]);
  }
  const widths = rows[0]!.map((_, c) => Math.max(...rows.map((r) => r[c]!.length)));
  const line = (r: string[]): string =>
    r.map((cell, c) => (c === 0 ? cell.padEnd(widths[c]!) : cell.padStart(widths[c]!))).join('  ');
  console.log(
    `datasets bench — ${cpus()[0]?.model ?? 'cpu'}, load ${loadavg()[0]!.toFixed(1)}, best of ${repeats}`,
  );
  console.log(line(rows[0]!));
  console.log(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const r of rows.slice(1)) console.log(line(r));
}

await main();
