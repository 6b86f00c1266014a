/** "Did you mean" suggestions for misspelt column and series names. */

/** Levenshtein distance (insertions, deletions, substitutions each cost 1). */
export function editDistance(a: string, b: string): number {
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      current.push(Math.min((previous[j] as number) + 1, (current[j - 1] as number) + 1, (previous[j - 1] as number) + cost));
    }
    previous = current;
  }
  return previous[b.length] as number;
}

/**
 * The closest candidate to `wanted`, compared case-insensitively and ignoring surrounding spaces;
 * undefined when nothing is within max(2, a third of the name's length) edits.
 */
export function closestName(wanted: string, candidates: readonly string[]): string | undefined {
  const target = wanted.trim().toLowerCase();
  let best: string | undefined;
  let bestDistance = Math.max(2, Math.floor(target.length / 3));
  for (const candidate of candidates) {
    const distance = editDistance(target, candidate.trim().toLowerCase());
    if (distance <= bestDistance && (best === undefined || distance < bestDistance)) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return best;
}
