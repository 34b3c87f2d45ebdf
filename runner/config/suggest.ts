/** Levenshtein edit distance (insertions, deletions, substitutions each cost 1). */
export function measureEditDistance(a: string, b: string): number {
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      current.push(
        Math.min((previous[j] ?? 0) + 1, (current[j - 1] ?? 0) + 1, (previous[j - 1] ?? 0) + cost),
      );
    }
    previous = current;
  }
  return previous[b.length] ?? 0;
}

/**
 * The closest candidate to `word` when it is close enough to be a likely typo: at most a
 * third of the word's length in edits (at least 2), compared case-insensitively.
 */
export function suggestClosest(word: string, candidates: readonly string[]): string | undefined {
  const limit = Math.max(2, Math.floor(word.length / 3));
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    const distance = measureEditDistance(word.toLowerCase(), candidate.toLowerCase());
    if (distance < bestDistance) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return bestDistance <= limit ? best : undefined;
}
