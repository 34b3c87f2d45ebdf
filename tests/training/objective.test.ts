import * as tf from '@tensorflow/tfjs';
import { beforeAll, describe, expect, it } from 'vitest';
import type { CriticKind, LossDirection } from '../../runner/config/types.ts';
import { createRng } from '../../runner/numeric/random.ts';
import {
  criticLogits,
  infoNce,
  regulariser,
  retrievalAccuracy,
} from '../../runner/training/objective.ts';
import { setupBackend } from './tf-setup.ts';

beforeAll(async () => {
  await setupBackend();
});

/** Naive reference: every logit by its definition (MATH.md §1), logsumexp without shifting. */
function naiveLoss(
  zx: number[][],
  zy: number[][],
  a: number[][],
  critic: CriticKind,
  direction: LossDirection,
): number {
  const d = zx[0]!.length;
  const b = zx.length;
  const f = (x: number[], y: number[]): number => {
    if (critic === 'inner') {
      let s = 0;
      for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) s += x[i]! * a[i]![j]! * y[j]!;
      return s;
    }
    let s = 0;
    for (let i = 0; i < d; i++) {
      let ax = 0;
      for (let j = 0; j < d; j++)
        ax += (critic === 'distance' ? a[i]![j]! : i === j ? 1 : 0) * x[j]!;
      s += (ax - y[i]!) ** 2;
    }
    return -0.5 * s;
  };
  const l = zx.map((x) => zy.map((y) => f(x, y)));
  let fwd = 0;
  let bwd = 0;
  for (let i = 0; i < b; i++) {
    fwd += -(l[i]![i]! - Math.log(l[i]!.reduce((s, v) => s + Math.exp(v), 0)));
    bwd += -(l[i]![i]! - Math.log(l.reduce((s, row) => s + Math.exp(row[i]!), 0)));
  }
  fwd /= b;
  bwd /= b;
  return direction === 'forward' ? fwd : direction === 'backward' ? bwd : (fwd + bwd) / 2;
}

function randomMatrix(rows: number, cols: number, seed: number, sd = 1): number[][] {
  const rng = createRng(seed);
  return Array.from({ length: rows }, () => Array.from({ length: cols }, () => rng.normal() * sd));
}

function lossOf(
  zx: number[][],
  zy: number[][],
  a: number[][],
  critic: CriticKind,
  direction: LossDirection,
): number {
  return tf.tidy(() => {
    const logits = criticLogits(
      tf.tensor2d(zx),
      tf.tensor2d(zy),
      critic === 'distance-identity' ? null : tf.tensor2d(a),
      critic,
    );
    return infoNce(logits, direction).dataSync()[0]!;
  });
}

describe('InfoNCE', () => {
  const critics: CriticKind[] = ['distance', 'distance-identity', 'inner'];
  const directions: LossDirection[] = ['forward', 'backward', 'symmetric'];
  for (const critic of critics) {
    for (const direction of directions) {
      it(`matches the naive computation: ${critic}, ${direction}`, () => {
        // Non-square-symmetric inputs (B=6, d=3, A not symmetric) so a transposed or
        // broadcast slip changes the value (van den Oord et al., 2018, eq. 4).
        const zx = randomMatrix(6, 3, 1);
        const zy = randomMatrix(6, 3, 2);
        const a = randomMatrix(3, 3, 3, 0.7);
        expect(lossOf(zx, zy, a, critic, direction)).toBeCloseTo(
          naiveLoss(zx, zy, a, critic, direction),
          4,
        );
      });
    }
  }

  it('equals a hand-worked case', () => {
    // B = 2, d = 1, A = I: ψx = [0, 1], ψy = [0, 2]. Logits −½(x−y)²: [[0, −2], [−½, −½]].
    // Forward: row 1: −(0 − log(1 + e^−2)) = log(1 + e^−2) = 0.126928;
    //          row 2: −(−½ − log(2e^−½)) = log 2 = 0.693147; mean 0.410038 (worked by hand).
    const zx = [[0], [1]];
    const zy = [[0], [2]];
    expect(lossOf(zx, zy, [[1]], 'distance-identity', 'forward')).toBeCloseTo(0.410038, 5);
    // Backward: column 1: −(0 − log(1 + e^−½)) = 0.474077; column 2: −(−½ − log(e^−2 + e^−½))
    // = log(1 + e^−1.5) = 0.201413; mean 0.337745 (worked by hand).
    expect(lossOf(zx, zy, [[1]], 'distance-identity', 'backward')).toBeCloseTo(0.337745, 5);
  });

  it('stays finite where the naive logsumexp overflows', () => {
    // Logits near −5000: exp underflows to 0 in the naive form (log 0 = −∞); the shifted
    // form is exact (common practice).
    const zx = [[0], [100]];
    const zy = [[0], [1]];
    const value = lossOf(zx, zy, [[1]], 'distance-identity', 'forward');
    expect(Number.isFinite(value)).toBe(true);
    expect(Number.isFinite(naiveLoss(zx, zy, [[1]], 'distance-identity', 'forward'))).toBe(false);
    // Row 1: logits [0, −½], positive 0: log(1 + e^−½) = 0.474077; row 2: logits
    // [−5000, −4900.5], positive −4900.5: log(1 + e^−99.5) ≈ 0. Mean 0.237038 (worked by hand).
    expect(value).toBeCloseTo(0.474077 / 2, 4);
  });

  it('scores top-1 retrieval by rows and columns', () => {
    const acc = tf.tidy(() => {
      const logits = tf.tensor2d([
        [3, 0, 0],
        [4, 1, 0],
        [0, 0, 2],
      ]);
      return [retrievalAccuracy(logits, 'forward'), retrievalAccuracy(logits, 'backward')].map(
        (t) => t.dataSync()[0]!,
      );
    });
    // Rows: argmax [0, 0, 2] → hits 1 and 3 of 3; columns: argmax [1, 1, 2] → hits 2 and 3.
    expect(acc[0]).toBeCloseTo(2 / 3, 6);
    expect(acc[1]).toBeCloseTo(2 / 3, 6);
  });
});

describe('Gaussian-marginal regulariser', () => {
  it('penalty equals λ(mean‖ψ‖²/d − c)²', () => {
    const z = randomMatrix(10, 3, 5);
    const meanSq = z.reduce((s, r) => s + r.reduce((t, v) => t + v * v, 0), 0) / 10 / 3;
    const value = tf.tidy(() => regulariser(tf.tensor2d(z), 'penalty', 2, 0.5).dataSync()[0]!);
    expect(value).toBeCloseTo(2 * (meanSq - 0.5) ** 2, 4);
  });

  it('moment KL equals the closed-form Gaussian KL (mathjs determinant as the oracle)', async () => {
    const { det, matrix, multiply, transpose } = await import('mathjs');
    const z = randomMatrix(40, 3, 6, 1.5);
    const n = z.length;
    const mu = [0, 1, 2].map((j) => z.reduce((s, r) => s + r[j]!, 0) / n);
    const centred = z.map((r) => r.map((v, j) => v - mu[j]!));
    const cov = (
      multiply(transpose(matrix(centred)), matrix(centred)) as ReturnType<typeof matrix>
    ).toArray() as number[][];
    const sigma = cov.map((r) => r.map((v) => v / n));
    const c = 2;
    // KL(N(μ, Σ) ‖ N(0, cI)) = ½[tr Σ/c + ‖μ‖²/c − d − ln det Σ + d ln c] (Kullback, 1959).
    const expected =
      0.5 *
      ((sigma[0]![0]! + sigma[1]![1]! + sigma[2]![2]!) / c +
        mu.reduce((s, v) => s + v * v, 0) / c -
        3 -
        Math.log(det(sigma)) +
        3 * Math.log(c));
    const value = tf.tidy(() => regulariser(tf.tensor2d(z), 'kl', 1, c).dataSync()[0]!);
    expect(value).toBeCloseTo(expected, 3);
  });
});
