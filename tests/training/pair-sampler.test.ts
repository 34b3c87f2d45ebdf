import { describe, expect, it } from 'vitest';
import type { Episode } from '../../runner/data/episode.ts';
import { createRng } from '../../runner/numeric/random.ts';
import { drawGeometric, PairSampler } from '../../runner/training/pair-sampler.ts';

/** One-dimensional episode whose observation is its step index, so offsets can be read back. */
function rampEpisode(steps: number): Episode {
  return { obs: Float32Array.from({ length: steps }, (_, t) => t), steps, obsDim: 1 };
}

describe('geometric offsets', () => {
  it('follow P(k) = (1−γ)γ^(k−1)', () => {
    // The geometric law's probabilities and mean 1/(1−γ) (Feller, 1968, vol. 1, §XI.2).
    const rng = createRng(1);
    const gamma = 0.7;
    const n = 40000;
    const counts = new Map<number, number>();
    let sum = 0;
    for (let i = 0; i < n; i++) {
      const k = drawGeometric(rng, gamma);
      counts.set(k, (counts.get(k) ?? 0) + 1);
      sum += k;
    }
    for (let k = 1; k <= 4; k++) {
      const p = (1 - gamma) * gamma ** (k - 1);
      // 5 binomial standard errors (common practice).
      expect(Math.abs((counts.get(k) ?? 0) / n - p)).toBeLessThan(5 * Math.sqrt((p * (1 - p)) / n));
    }
    expect(sum / n).toBeCloseTo(1 / (1 - gamma), 1);
  });

  it('redraw past the episode end instead of clipping', () => {
    // Anchor t = 7 in a 10-step episode: valid k ∈ {1, 2}; redrawing gives the geometric law
    // conditioned on k ≤ 2: P(1) = 1/(1+γ), P(2) = γ/(1+γ). Clipping would give P(2) = γ.
    const sampler = new PairSampler([rampEpisode(10)], 0.8);
    const rng = createRng(2);
    let twos = 0;
    let near = 0;
    let invalid = 0;
    for (let r = 0; r < 400; r++) {
      const batch = sampler.sample(rng, 100);
      for (let i = 0; i < batch.size; i++) {
        const k = batch.y[i]! - batch.x[i]!;
        if (k < 1 || batch.y[i]! >= 10) invalid++;
        if (batch.x[i] === 7) {
          near++;
          if (k === 2) twos++;
        }
      }
    }
    expect(invalid).toBe(0);
    const p = 0.8 / 1.8;
    expect(Math.abs(twos / near - p)).toBeLessThan(5 * Math.sqrt((p * (1 - p)) / near));
  });

  it('rejects episodes too short for any pair, with a code', () => {
    expect(() => new PairSampler([rampEpisode(1)], 0.5)).toThrow(
      expect.objectContaining({ code: 'dataset-too-short' }),
    );
  });
});
