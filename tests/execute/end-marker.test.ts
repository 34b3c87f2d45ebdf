import { describe, expect, it } from 'vitest';
import { EndMarkerScanner } from '../../runner/execute/end-marker.ts';

const MARKER = '\n::end 1f2e::\n';

/** Feeds `text` cut at `cuts` and returns what came out before and after the marker. */
function feedInPieces(
  text: string,
  cuts: number[],
): { before: string; after: string; found: number } {
  const scanner = new EndMarkerScanner(MARKER);
  let before = '';
  let after = '';
  let found = 0;
  const bounds = [0, ...cuts, text.length];
  for (let i = 0; i + 1 < bounds.length; i += 1) {
    const chunk = text.slice(bounds[i], bounds[i + 1]);
    if (found > 0) {
      after += chunk;
      continue;
    }
    const piece = scanner.feed(chunk);
    before += piece.before;
    if (piece.found) {
      found += 1;
      after += piece.after;
    }
  }
  if (found === 0) before += scanner.flush();
  return { before, after, found };
}

describe('EndMarkerScanner', () => {
  // A job's output containing false starts of the marker ("\n::end", "::e") around the real one.
  const job = 'rover at aisle 4\n::end of shift\nbattery 71%\n::e';
  const next = 'stray line\n';
  const text = job + MARKER + next;

  it('splits output at the marker however the pipe cuts it into two chunks', () => {
    for (let cut = 0; cut <= text.length; cut += 1) {
      expect(feedInPieces(text, [cut])).toEqual({ before: job, after: next, found: 1 });
    }
  });

  it('splits output at the marker for every cut into three chunks', () => {
    for (let a = 0; a <= text.length; a += 1) {
      for (let b = a; b <= text.length; b += 1) {
        expect(feedInPieces(text, [a, b])).toEqual({ before: job, after: next, found: 1 });
      }
    }
  });

  it('passes output without the marker through unchanged, a held-back tail included', () => {
    const partial = `${job}\n::end 1f2`;
    for (let cut = 0; cut <= partial.length; cut += 1) {
      expect(feedInPieces(partial, [cut])).toEqual({ before: partial, after: '', found: 0 });
    }
  });
});
