/** "Did you mean …": the nearest known names to a misspelt one, as a hint and a quick fix. */
import { replaceWith } from './diagnostic.js';
import type { FixSpec } from './diagnostic.js';

/** Optimal string alignment distance: edits, with a swap of two neighbours counting as one. */
export function editDistance(a: string, b: string): number {
  if (a === b) return 0;
  if (a.length === 0) return b.length;
  if (b.length === 0) return a.length;
  const rows = a.length + 1;
  const cols = b.length + 1;
  const d: number[] = new Array<number>(rows * cols).fill(0);
  for (let i = 0; i < rows; i++) d[i * cols] = i;
  for (let j = 0; j < cols; j++) d[j] = j;
  for (let i = 1; i < rows; i++) {
    for (let j = 1; j < cols; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let best = Math.min(d[(i - 1) * cols + j] + 1, d[i * cols + j - 1] + 1, d[(i - 1) * cols + j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) {
        best = Math.min(best, d[(i - 2) * cols + j - 2] + 1);
      }
      d[i * cols + j] = best;
    }
  }
  return d[rows * cols - 1];
}

/**
 * The candidates nearest to `name`, best first: a match that differs only in letter case,
 * else those within a small edit distance (1 for short names, about a third of the length
 * for longer ones). Empty when nothing is close.
 */
export function suggest(name: string, candidates: Iterable<string>): string[] {
  const unique = [...new Set(candidates)].filter((c) => c !== name);
  const lower = name.toLowerCase();
  const caseOnly = unique.filter((c) => c.toLowerCase() === lower);
  if (caseOnly.length > 0) return caseOnly;
  const limit = name.length <= 3 ? 1 : Math.max(1, Math.floor(name.length / 3));
  const scored = unique
    .filter((c) => Math.abs(c.length - name.length) <= limit)
    .map((c) => ({ c, d: editDistance(lower, c.toLowerCase()) }))
    .filter(({ c, d }) => d <= limit && !(name.length <= 2 && c.length <= 2 && d >= Math.max(name.length, c.length)))
    .sort((x, y) => x.d - y.d || x.c.localeCompare(y.c));
  if (scored.length === 0) return [];
  const best = scored[0].d;
  return scored.filter((s) => s.d === best).map((s) => s.c);
}

/** What to say about a misspelt name. */
export interface Suggestion {
  /** The nearest candidates, best first; empty when none is close. */
  names: string[];
  /** "did you mean `a`?" or "did you mean `a` or `b`?"; undefined when nothing is close. */
  question: string | undefined;
  /** Replaces the name with the one nearest candidate; undefined unless exactly one is nearest. */
  fix: FixSpec | undefined;
}

/** The "did you mean" of `name` among `candidates`: the question for the hint and the quick fix. */
export function didYouMean(name: string, candidates: Iterable<string>): Suggestion {
  const names = suggest(name, candidates);
  if (names.length === 0) return { names, question: undefined, fix: undefined };
  const shown = names.slice(0, 3).map((s) => `\`${s}\``);
  const list = shown.length === 1 ? shown[0] : `${shown.slice(0, -1).join(', ')} or ${shown[shown.length - 1]}`;
  const fix = names.length === 1 ? replaceWith(names[0]) : undefined;
  return { names, question: `did you mean ${list}?`, fix };
}

/**
 * A hint for a misspelt name: the question followed by `more` as a sentence of its own, or
 * `otherwise` (by default `more`) when nothing is close.
 */
export function suggestionHint(s: Suggestion, more?: string, otherwise: string | undefined = more): string | undefined {
  if (s.question === undefined) return otherwise;
  return more === undefined ? s.question : `${s.question} ${more.charAt(0).toUpperCase()}${more.slice(1)}${/[.?!]$/.test(more) ? '' : '.'}`;
}
