/**
 * "Did you mean" for misspelt flags, commands and names on the command line.
 *
 * Method: the optimal string alignment distance, i.e. Levenshtein's
 * insertions, deletions and substitutions (V. I. Levenshtein, "Binary codes
 * capable of correcting deletions, insertions, and reversals", Soviet Physics
 * Doklady 10(8), 1966) plus the transposition of two adjacent letters, the
 * fourth single error of F. J. Damerau, "A technique for computer detection
 * and correction of spelling errors", Communications of the ACM 7(3), 1964,
 * pp. 171-176. Dynamic programming over the two words, O(|a| |b|) time.
 * Accuracy: exact for this restricted variant, which edits no substring twice
 * and so can exceed the unrestricted Damerau-Levenshtein distance (R. Lowrance
 * and R. A. Wagner, J. ACM 22(2), 1975) on words such as "ca" / "abc" (3
 * against 2); for the short names of a command line the two agree on every
 * single error, which is what a suggestion is for.
 *
 * The threshold of a suggestion (a third of the word's length, at least one
 * edit) is common practice, no source.
 *
 * @module
 */

/**
 * The optimal string alignment distance between two words: the fewest
 * insertions, deletions, substitutions and adjacent transpositions that turn
 * one into the other, no substring edited twice.
 *
 * @param a - one word
 * @param b - the other
 * @returns the number of edits (0 when equal)
 * @example
 * ```ts
 * editDistance("butterwroth", "butterworth"); //=> 1
 * editDistance("lowpas", "lowpass"); //=> 1
 * ```
 */
export function editDistance(a: string, b: string): number {
  const n = a.length;
  const m = b.length;
  if (n === 0) return m;
  if (m === 0) return n;
  // Three rows of the (n + 1) x (m + 1) table: two back (for transpositions), one back, current.
  let back2 = new Array<number>(m + 1).fill(0);
  let back1 = Array.from({ length: m + 1 }, (_, j) => j);
  let cur = new Array<number>(m + 1).fill(0);
  for (let i = 1; i <= n; i++) {
    cur[0] = i;
    for (let j = 1; j <= m; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let d = Math.min((back1[j] as number) + 1, (cur[j - 1] as number) + 1, (back1[j - 1] as number) + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d = Math.min(d, (back2[j - 2] as number) + 1);
      cur[j] = d;
    }
    [back2, back1, cur] = [back1, cur, back2];
  }
  return back1[m] as number;
}

/**
 * The candidates closest to a misspelt word, compared without regard to
 * case: those at the smallest distance, when that distance is at most a third
 * of the word's length (at least one edit), or those the word is the start of.
 *
 * @param word - what the user typed
 * @param candidates - the accepted spellings
 * @returns up to three suggestions, best first (empty when nothing is close)
 * @example
 * ```ts
 * closestNames("chebyshev", ["butterworth", "chebyshev1", "chebyshev2"]); //=> ["chebyshev1", "chebyshev2"]
 * ```
 */
export function closestNames(word: string, candidates: readonly string[]): string[] {
  const w = word.toLowerCase();
  if (w === "") return [];
  const limit = Math.max(1, Math.floor(w.length / 3));
  let best = Infinity;
  let found: string[] = [];
  for (const c of candidates) {
    const d = editDistance(w, c.toLowerCase());
    if (d > limit || d > best) continue;
    if (d < best) {
      best = d;
      found = [];
    }
    found.push(c);
  }
  if (found.length === 0 && w.length >= 3) found = candidates.filter((c) => c.toLowerCase().startsWith(w));
  return found.slice(0, 3);
}

/**
 * The "did you mean" clause for a misspelt word, or `""` when nothing is close.
 *
 * @param word - what the user typed
 * @param candidates - the accepted spellings
 * @param prefix - written before each suggestion (`"--"` for flags)
 * @returns `'; did you mean "x"?'`, `'; did you mean "x" or "y"?'`, or `""`
 * @example
 * ```ts
 * didYouMean("lowpas", ["lowpass", "highpass"]); //=> '; did you mean "lowpass"?'
 * ```
 */
export function didYouMean(word: string, candidates: readonly string[], prefix = ""): string {
  const s = closestNames(word, candidates).map((c) => `"${prefix}${c}"`);
  if (s.length === 0) return "";
  const last = s.pop() as string;
  return `; did you mean ${s.length === 0 ? last : `${s.join(", ")} or ${last}`}?`;
}
