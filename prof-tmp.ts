import * as tf from '@tensorflow/tfjs';
import { selectBackend } from './runner/encoders/backend.ts';
import { createEngine } from './runner/training/engine.ts';
import { loadEngines } from './runner/training/engines.ts';
import { setFastMatMul } from './runner/encoders/fast-matmul.ts';
import { createRng } from './runner/numeric/random.ts';
await selectBackend('wasm'); await loadEngines();
const train = { steps: 0, batch: 256, lr: 1e-3, discount: 0.9, critic: 'distance', loss: 'symmetric', regulariser: 'penalty', weight: 1, scale: 1, clip: 1, logEvery: 100, engine: 'tfjs' } as const;
for (const custom of [true, false]) {
  setFastMatMul(custom);
  const engine = await createEngine('tfjs', { encoder: { kind: 'mlp', widths: [256, 256], activation: 'relu', layerNorm: false, channels: [], options: {} }, obsDim: 64, dim: 16, train, threads: 1, seed: 0 });
  const rng = createRng(0);
  const x = Float32Array.from({ length: 256 * 64 }, () => rng.normal());
  const y = Float32Array.from({ length: 256 * 64 }, () => rng.normal());
  for (let i = 0; i < 3; i++) engine.step(x, y, 256);
  const agg = new Map<string, number>();
  const prof = await tf.profile(() => { engine.step(x, y, 256); });
  for (const k of prof.kernels) agg.set(k.name, (agg.get(k.name) ?? 0) + (k.kernelTimeMs as number));
  const total = [...agg.values()].reduce((a, b) => a + b, 0);
  console.log(custom ? 'CUSTOM' : 'DEFAULT', 'kernels', prof.kernels.length, 'total kernel ms', total.toFixed(1));
  console.log([...agg.entries()].sort((a, b) => b[1] - a[1]).slice(0, 14).map(([k, v]) => `${k} ${v.toFixed(1)}`).join('\n'));
  const t0 = performance.now(); for (let i = 0; i < 10; i++) engine.step(x, y, 256); console.log('wall ms/step', ((performance.now() - t0) / 10).toFixed(1));
  engine.dispose();
}
