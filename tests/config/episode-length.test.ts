/**
 * The episode-length check: an h-step forecast needs h + 1 steps and a bridge with T
 * waypoints T + 2 (both ends), per combination the plan will run.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadExperiment } from '../../runner/config/load-experiment.ts';

async function codesOf(yaml: string): Promise<string[]> {
  const dir = mkdtempSync(join(tmpdir(), 'midpath-length-'));
  const file = join(dir, 'experiment.yaml');
  writeFileSync(file, yaml);
  const result = await loadExperiment(file);
  return result.ok ? [] : result.errors.map((e) => `${e.code} ${e.line}:${e.col}`);
}

describe('episodes too short for the evaluation', () => {
  it('accepts exactly the steps needed and refuses one fewer', async () => {
    const evalBlock = 'eval: { horizons: [1, 5], waypoints: [2] }'; // needs max(6, 4) = 6
    expect(await codesOf(`data: { steps: 6 }\n${evalBlock}\n`)).toEqual([]);
    expect(await codesOf(`data: { steps: 5 }\n${evalBlock}\n`)).toEqual(['episodes-too-short 1:9']);
  });

  it('counts waypoints only when a bridging suite runs', async () => {
    const data = 'data: { steps: 6 }';
    expect(
      await codesOf(`${data}\neval: { suites: [forecast], horizons: [2], waypoints: [9] }\n`),
    ).toEqual([]);
    expect(
      await codesOf(`${data}\neval: { suites: [bridge], horizons: [2], waypoints: [9] }\n`),
    ).toEqual(['episodes-too-short 1:9']);
  });

  it('checks each combination of a together group, not the cross product', async () => {
    // Short episodes paired with short horizons only: every combination is fine.
    const ok = [
      'data: { steps: 30 }',
      'sweep:',
      '  together:',
      "    - { 'data.steps': [4, 30], 'eval.horizons': [[2], [20]] }",
      'eval: { waypoints: [1] }',
    ].join('\n');
    expect(await codesOf(`${ok}\n`)).toEqual([]);
    const bad = ok.replace('[[2], [20]]', '[[20], [2]]');
    expect(await codesOf(`${bad}\n`)).toEqual(['episodes-too-short 4:24']);
  });

  it('leaves a user file to its own check when it loads', async () => {
    const yaml = 'data: { source: file, steps: 3, file: { path: rover.csv } }\n';
    expect(await codesOf(yaml)).toEqual([]);
  });
});
