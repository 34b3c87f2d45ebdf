/**
 * The optional native build: when it cannot compile (here: a PATH with node and nothing
 * else, so no compiler, make or Python), the install script still exits 0 and prints one line
 * saying native training is unavailable and why; a training job with train.engine 'auto'
 * then completes on TF.js and its result says which engine ran.
 *
 * The build runs on a copy of native/ (MIDPATH_NATIVE_DIR), so the real addon other tests
 * load is never touched; this file then points the loader at the copy's missing output.
 */
import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, mkdtempSync, rmSync, symlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { loadDataset } from '../../runner/data/load-dataset.ts';
import { loadEngines } from '../../runner/training/engines.ts';
import { fitMethod } from '../../runner/training/fit-method.ts';
import {
  encoderConfig,
  quietHooks,
  smallData,
  trainConfig,
  trainSpec,
} from '../training/fixtures.ts';
import { setupBackend } from '../training/tf-setup.ts';

const root = fileURLToPath(new URL('../../', import.meta.url));
const work = mkdtempSync(join(tmpdir(), 'midpath-install-'));
const copy = join(work, 'native');
const bin = join(work, 'bin');

function runBuildScript(env: Record<string, string>): { status: number | null; lines: string[] } {
  const run = spawnSync(process.execPath, [join(root, 'scripts', 'build-native.mjs')], {
    encoding: 'utf8',
    env: { HOME: process.env.HOME ?? work, ...env },
  });
  const lines = `${run.stdout}${run.stderr}`.split('\n').filter((l) => l.trim() !== '');
  return { status: run.status, lines };
}

describe('install without a toolchain', () => {
  afterAll(() => rmSync(work, { recursive: true, force: true }));

  it('exits 0 with one line saying native training is unavailable and why', () => {
    cpSync(join(root, 'native'), copy, {
      recursive: true,
      filter: (src) => !src.includes(`${join('native', 'build')}`),
    });
    mkdirSync(bin);
    symlinkSync(process.execPath, join(bin, 'node'));
    const { status, lines } = runBuildScript({ PATH: bin, MIDPATH_NATIVE_DIR: copy });
    expect(status).toBe(0);
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(
      /^midpath: native training engine unavailable \(build failed: .+\); training will use TF\.js/,
    );
    expect(existsSync(join(copy, 'build', 'Release', 'midpath_native.node'))).toBe(false);
  });

  it('exits 0 with one line when the build is switched off', () => {
    const { status, lines } = runBuildScript({ PATH: bin, MIDPATH_SKIP_NATIVE: '1' });
    expect(status).toBe(0);
    expect(lines).toEqual([
      'midpath: native training engine unavailable (MIDPATH_SKIP_NATIVE=1 is set); training will use TF.js. See docs/native.md.',
    ]);
  });

  it("trains on TF.js with train.engine 'auto' and records the engine", async () => {
    // The loader reads this once per process; this file runs in its own worker.
    process.env.MIDPATH_NATIVE_ADDON = join(copy, 'build', 'Release', 'midpath_native.node');
    await setupBackend();
    await loadEngines();
    const data = smallData({ episodes: 10, steps: 20 });
    const spec = trainSpec({
      data,
      encoder: encoderConfig({ widths: [8] }),
      train: trainConfig({ steps: 20, logEvery: 10, engine: 'auto' }),
    });
    const dataset = await loadDataset(data, '.');
    const lines: string[] = [];
    const fit = await fitMethod(spec.method, dataset, spec, quietHooks(lines));
    expect(fit.status).toBe('done');
    expect(fit.info.engine).toBe('tfjs');
    expect(lines.some((l) => /native engine unavailable \(the addon is not built/.test(l))).toBe(
      true,
    );
  });
});
