/**
 * The native engine behind the StepEngine interface: the async step runs off the event loop
 * and matches the sync one; misuse gets clear errors; a training job asks for it by name and
 * its result records the engine and the kernel.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { loadDataset } from '../../runner/data/load-dataset.ts';
import { loadEngines } from '../../runner/training/engines.ts';
import { fitMethod } from '../../runner/training/fit-method.ts';
import { createNativeEngine, NativeEngine } from '../../runner/training/native-engine.ts';
import {
  encoderConfig,
  quietHooks,
  smallData,
  trainConfig,
  trainSpec,
} from '../training/fixtures.ts';
import { setupBackend } from '../training/tf-setup.ts';
import {
  agreementOptions,
  batchSize,
  initialParams,
  makeBatches,
  type Batch,
} from './agreement-setup.ts';
import { nativeAddonForTests } from './native-required.ts';

const addon = nativeAddonForTests();

async function engineFor(kernel = 'auto'): Promise<NativeEngine> {
  const options = agreementOptions({}, {});
  const engine = (await createNativeEngine(options, kernel)) as NativeEngine;
  engine.init(initialParams(options, 1));
  return engine;
}

describe.skipIf(addon === undefined)('native engine', () => {
  let batches: Batch[] = [];
  beforeAll(() => {
    batches = makeBatches(4, 2);
  });

  it('runs an async step off the event loop, with the same result as the sync step', async () => {
    const a = await engineFor();
    const b = await engineFor();
    const order: string[] = [];
    const pending = a.stepAsync(batches[0]!.x, batches[0]!.y, batchSize).then((s) => {
      order.push('step');
      return s;
    });
    // A step computed on the calling thread would settle (a microtask) before this runs.
    setImmediate(() => order.push('event loop'));
    const asyncStats = await pending;
    await new Promise((r) => setImmediate(r));
    expect(order[0]).toBe('event loop');
    expect(asyncStats).toEqual(b.step(batches[0]!.x, batches[0]!.y, batchSize));
    expect(a.getParams()).toEqual(b.getParams());
    a.dispose();
    b.dispose();
  });

  it('refuses a second step while one is running, and any call after dispose', async () => {
    const e = await engineFor();
    const pending = e.stepAsync(batches[0]!.x, batches[0]!.y, batchSize);
    expect(() => e.step(batches[1]!.x, batches[1]!.y, batchSize)).toThrow(/still running/);
    await pending;
    e.dispose();
    expect(() => e.getParams()).toThrow(/disposed/);
  });

  it('checks the parameter layout and the batch buffers', async () => {
    const e = await engineFor();
    expect(() => e.init([new Float32Array(3)])).toThrow(/expected \d+ parameter arrays/);
    expect(() => e.step(new Float32Array(5), new Float32Array(5), batchSize)).toThrow(
      /batchX to hold at least 96 floats, got 5/,
    );
    e.dispose();
  });

  it('leaves the parameters unchanged on a non-finite step and reports it', async () => {
    const e = await engineFor();
    const before = e.getParams();
    const x = Float32Array.from(batches[0]!.x);
    x[0] = Number.NaN;
    const stats = e.step(x, batches[0]!.y, batchSize);
    expect(Number.isNaN(stats.loss)).toBe(true);
    expect(e.getParams()).toEqual(before);
    e.dispose();
  });

  it('uses every kernel the CPU supports and rejects unknown ones', async () => {
    for (const kernel of addon!.kernels().supported) {
      const e = await engineFor(kernel);
      expect(e.kernel).toBe(kernel);
      e.dispose();
    }
    await expect(engineFor('mmx')).rejects.toThrow(/kernel 'mmx' cannot run: unknown kernel name/);
  });

  it('refuses encoders it cannot train, naming the kind', async () => {
    const options = agreementOptions({ kind: 'conv' }, {});
    await expect(createNativeEngine(options)).rejects.toThrow(
      /linear and MLP encoders, not 'conv'/,
    );
  });

  it("trains a job with train.engine 'native' and records engine and kernel", async () => {
    await setupBackend();
    await loadEngines();
    const data = smallData({ episodes: 10, steps: 20 });
    const spec = trainSpec({
      data,
      encoder: encoderConfig({ widths: [8] }),
      train: trainConfig({ steps: 20, logEvery: 10, engine: 'native' }),
    });
    const fit = await fitMethod(spec.method, await loadDataset(data, '.'), spec, quietHooks());
    expect(fit.status).toBe('done');
    expect(fit.info.engine).toBe('native');
    expect(addon!.kernels().supported).toContain(fit.info.kernel);
  });
});
