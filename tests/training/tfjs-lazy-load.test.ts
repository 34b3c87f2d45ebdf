/**
 * TF.js (≈ 2 s to import and start per worker process) must load only when a job needs it:
 * not for a contrastive job on the native engine, not for the closed-form baselines, and not
 * for an evaluate job of a linear/MLP representation (encoded by encoders/dense-forward.ts).
 *
 * Each scenario runs in a fresh process, as a real worker does (tfjs-load-probe.ts explains
 * how loading is detected). The control scenario, a job on the tfjs engine, must report
 * TF.js as loaded, so the probe is shown able to see it.
 */
import { execFile } from 'node:child_process';
import { mkdir, mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { saveRepresentation } from '../../runner/execute/jobs/representation-files.ts';
import { initDenseParams } from '../../runner/encoders/dense-layout.ts';
import { createRng } from '../../runner/numeric/random.ts';
import { nativeAddonForTests } from '../native/native-required.ts';
import { encoderConfig } from './fixtures.ts';
import { probeData } from './tfjs-load-probe.ts';

const run = promisify(execFile);
const probe = fileURLToPath(new URL('./tfjs-load-probe.ts', import.meta.url));
const hasNative = nativeAddonForTests() !== undefined;

interface ProbeReport {
  ran: string[];
  tfjsFiles: number;
  tfjsEngine: boolean;
}

async function runProbe(scenario: string, dir: string): Promise<ProbeReport> {
  const { stdout } = await run(process.execPath, ['--import', 'tsx', probe, scenario, dir], {
    timeout: 120_000,
  });
  const last = stdout.trim().split('\n').pop() ?? '';
  return JSON.parse(last) as ProbeReport;
}

describe('TF.js loads only when a job needs it', () => {
  let dir = '';
  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), 'midpath-lazy-tfjs-'));
  });
  afterAll(async () => {
    await rm(dir, { recursive: true, force: true });
  });

  it.skipIf(!hasNative)(
    'a contrastive train job on the native engine does not load it',
    async () => {
      const report = await runProbe('native', dir);
      expect(report.ran).toEqual(['contrastive:done:native']);
      expect(report.tfjsFiles).toBe(0);
      expect(report.tfjsEngine).toBe(false);
    },
  );

  it('train jobs of the closed-form baselines do not load it', async () => {
    const report = await runProbe('baselines', dir);
    expect(report.ran.map((r) => r.split(':').slice(0, 2).join(':'))).toEqual([
      'pca:done',
      'sfa:done',
      'raw:done',
      'random:done',
    ]);
    expect(report.tfjsFiles).toBe(0);
    expect(report.tfjsEngine).toBe(false);
  });

  it('an evaluate job of a saved MLP representation does not load it', async () => {
    // An MLP representation with layer norm and a learned critic, as a contrastive job saves it.
    const encoder = encoderConfig({ widths: [8], activation: 'tanh', layerNorm: true });
    const params = initDenseParams(encoder, probeData.obsDim, 3, 'distance', createRng(5));
    const arrays: Record<string, { shape: number[]; data: Float32Array }> = {};
    params.slice(0, -1).forEach((p, i) => (arrays[`p${i}`] = { shape: [p.length], data: p }));
    arrays.A = { shape: [3, 3], data: params[params.length - 1]! };
    await mkdir(join(dir, 'train'), { recursive: true });
    await saveRepresentation(join(dir, 'train'), {
      method: 'contrastive',
      label: 'contrastive',
      dim: 3,
      obsDim: probeData.obsDim,
      model: { kind: 'encoder', encoder, seed: 5, baseDir: '.' },
      arrays,
      critic: { kind: 'distance', c: 1 },
      meta: {},
    });
    const report = await runProbe('evaluate', dir);
    expect(report.ran[0]).toMatch(/^evaluate:done:[1-9]/);
    expect(report.tfjsFiles).toBe(0);
    expect(report.tfjsEngine).toBe(false);
  });

  it('a train job on the tfjs engine does load it (the probe can see it)', async () => {
    const report = await runProbe('tfjs', dir);
    expect(report.ran).toEqual(['contrastive:done:tfjs']);
    expect(report.tfjsFiles).toBeGreaterThan(0);
    expect(report.tfjsEngine).toBe(true);
  });
});
