/**
 * Edit distance between two names: the optimal-string-alignment form of the Damerau–Levenshtein distance
 * (insertions, deletions, substitutions and transpositions of adjacent characters, each costing 1; no substring
 * is edited twice). F. J. Damerau, "A technique for computer detection and correction of spelling errors",
 * Commun. ACM 7(3), 171–176 (1964); V. I. Levenshtein, Soviet Physics Doklady 10(8), 707–710 (1966).
 */
export function editDistance(a: string, b: string): number {
  // Three rolling rows: the transposition step looks two rows back.
  let before = new Array<number>(b.length + 1).fill(0);
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let best = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) best = Math.min(best, before[j - 2] + 1);
      current.push(best);
    }
    before = previous;
    previous = current;
  }
  return previous[b.length];
}

/**
 * The valid name closest to a misspelt one, or null when none is close enough to be a likely slip: at most one edit
 * per three characters, common practice for spelling suggestions (so a one- or two-letter name is only matched up to
 * case: b is no slip of a). Ties go to the earlier candidate.
 */
export function nearestName(written: string, candidates: Iterable<string>): string | null {
  const allowed = Math.floor(written.length / 3);
  let best: string | null = null;
  let bestDistance = allowed + 1;
  for (const candidate of candidates) {
    if (candidate === written) continue;
    const distance = editDistance(written.toLowerCase(), candidate.toLowerCase());
    if (distance < bestDistance) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return best;
}

/** `: did you mean x?` for a message, or nothing when no candidate is close. */
export function didYouMean(written: string, candidates: Iterable<string>): string {
  const near = nearestName(written, candidates);
  return near === null ? '' : `: did you mean ${near}?`;
}
