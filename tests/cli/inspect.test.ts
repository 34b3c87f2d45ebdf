import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import { bufferIo } from '../helpers/cli-io.ts';

const root = fileURLToPath(new URL('../../', import.meta.url));
const fixtures = fileURLToPath(new URL('../fixtures/data/', import.meta.url));

/** Writes an experiment file in a fresh temporary folder and returns its path. */
function writeExperiment(yaml: string): string {
  const dir = mkdtempSync(join(tmpdir(), 'midpath-inspect-'));
  const file = join(dir, 'experiment.yaml');
  writeFileSync(file, yaml);
  return file;
}

interface InspectJson {
  minSteps: number;
  datasets: {
    label: string;
    summary: { name: string; obsDim: number; splits: Record<string, { episodes: number }> };
  }[];
}

const examples = [
  'linear-gaussian',
  'rover-maze',
  'swinging-lamp',
  'lorenz',
  'seattle-weather',
  'user-file',
];

describe('example configs, one per dataset', () => {
  it.each(examples)('configs/examples/%s.yaml passes check and inspect', async (name) => {
    const file = `configs/examples/${name}.yaml`;
    const checked = bufferIo(root);
    expect(await main(['check', file], checked)).toBe(0);
    const inspected = bufferIo(root);
    expect(await main(['inspect', file, '--json'], inspected)).toBe(0);
    const out = JSON.parse(inspected.stdout.join('')) as InspectJson;
    expect(out.datasets[0]!.summary.name).toBe(name === 'user-file' ? 'file' : name);
  });
});

describe('midpath inspect', () => {
  it('prints splits, sizes and ranges of an example config', async () => {
    const io = bufferIo(root);
    expect(await main(['inspect', 'configs/examples/user-file.yaml'], io)).toBe(0);
    const text = io.stdout.join('');
    expect(text).toContain('train 3 · val 1 · test 2');
    expect(text).toContain('3 dims');
  });

  it('--json lists one dataset per value of a swept data axis', async () => {
    const file = writeExperiment(
      [
        'data: { episodes: 12, steps: 16, obsDim: 4 }',
        'eval: { horizons: [1, 2], waypoints: [1] }',
        'sweep:',
        '  axes:',
        '    data:',
        '      - { source: linear-gaussian, stateDim: 2 }',
        '      - { source: rover-maze, layout: long-corridors }',
      ].join('\n'),
    );
    const io = bufferIo(root);
    expect(await main(['inspect', file, '--json'], io)).toBe(0);
    const out = JSON.parse(io.stdout.join('')) as InspectJson;
    expect(out.minSteps).toBe(3);
    expect(out.datasets.map((d) => d.summary.name)).toEqual(['linear-gaussian', 'rover-maze']);
    expect(out.datasets[1]!.label).toContain('long-corridors');
    expect(out.datasets[0]!.summary.splits['train']!.episodes).toBe(8);
  });

  it('--json follows sweep.together groups over data.* as the plan does', async () => {
    const file = writeExperiment(
      [
        'data: { episodes: 10, steps: 12, obsDim: 4, stateDim: 2 }',
        'eval: { horizons: [1], waypoints: [1] }',
        'sweep:',
        '  axes:',
        '    dim: [2, 3]',
        '  together:',
        "    - { 'data.noise': [0.01, 0.3], 'train.discount': [0.8, 0.95] }",
      ].join('\n'),
    );
    const io = bufferIo(root);
    expect(await main(['inspect', file, '--json'], io)).toBe(0);
    const out = JSON.parse(io.stdout.join('')) as InspectJson;
    // Two noise levels, one dataset each; the dim axis and train.discount do not touch the data.
    expect(out.datasets.map((d) => d.label)).toEqual(['data.noise = 0.01', 'data.noise = 0.3']);
  });

  it('shows an ASCII preview for image data', async () => {
    const file = writeExperiment(
      'data: { source: swinging-lamp, image: 8, episodes: 4, steps: 12, split: { train: 0.5, val: 0.25, test: 0.25 } }\neval: { horizons: [1], waypoints: [1] }\n',
    );
    const io = bufferIo(root);
    expect(await main(['inspect', file], io)).toBe(0);
    const text = io.stdout.join('');
    expect(text).toContain('8×8 images');
    expect(text).toMatch(/preview/);
    expect(text).toMatch(/[@%#]/);
  });

  it('stops on a malformed data file with exit 2, naming file, row and code', async () => {
    const file = writeExperiment(
      `data:\n  source: file\n  file:\n    path: ${join(fixtures, 'nan.csv')}\n    state: [pos]\neval: { horizons: [1], waypoints: [1] }\n`,
    );
    const io = bufferIo(root);
    expect(await main(['inspect', file], io)).toBe(2);
    const err = io.stderr.join('');
    expect(err).toContain('nan.csv:10');
    expect(err).toContain('non-finite');
    expect(io.stdout.join('')).toBe('');
  });

  it('stops when episodes are shorter than the evaluation needs, pointing at data.steps', async () => {
    const file = writeExperiment(
      'data: { episodes: 5, steps: 6 }\neval: { horizons: [1, 8], waypoints: [1] }\n',
    );
    const io = bufferIo(root);
    expect(await main(['inspect', file], io)).toBe(2);
    expect(io.stderr.join('')).toMatch(/:1:\d+ {2}episodes-too-short {2}expected data.steps ≥ 9/);
  });

  it('reports config errors and usage errors with exit 2', async () => {
    const io = bufferIo(root);
    expect(await main(['inspect', writeExperiment('data: { sorce: lorenz }\n')], io)).toBe(2);
    expect(io.stderr.join('')).toContain(':1:');
    const usage = bufferIo(root);
    expect(await main(['inspect'], usage)).toBe(2);
    expect(usage.stderr.join('')).toContain('Usage: midpath inspect');
  });
});
