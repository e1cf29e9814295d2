import type { PartCheck, SessionVerdict } from './plan-check.ts';
import type { PartKind } from './types.ts';

/** What the sentence needs of each checked part, in the plan's order. */
export type DescribedPart = Pick<PartCheck, 'kind' | 'verdict'>;

/** The quality kinds a session is about; counted first ("4 of 6 reps on pace"). */
const KEY_KINDS: readonly PartKind[] = ['rep', 'tempo', 'goal pace', 'strides', 'steady'];

/** Singular and plural nouns per kind, in product.md's words. */
const NOUNS: Readonly<Record<PartKind, readonly [string, string]>> = {
  'warm-up': ['warm-up', 'warm-ups'],
  easy: ['easy part', 'easy parts'],
  steady: ['steady part', 'steady parts'],
  tempo: ['tempo part', 'tempo parts'],
  'goal pace': ['goal-pace part', 'goal-pace parts'],
  rep: ['rep', 'reps'],
  'recovery jog': ['recovery jog', 'recovery jogs'],
  'cool-down': ['cool-down', 'cool-downs'],
  strides: ['stride', 'strides'],
};
const PART_NOUNS = ['part', 'parts'] as const;
/** Kinds a plan repeats; named by their count within the kind, as the table does ("rep 4 of 6"). */
const REPEATED_KINDS: readonly PartKind[] = ['rep', 'recovery jog', 'strides'];

/** The opening words per session verdict. */
export const SESSION_HEADLINES: Readonly<Record<SessionVerdict, string>> = {
  'as planned': 'As planned',
  partly: 'Partly as planned',
  missed: 'Missed',
  unplanned: 'Unplanned',
};

/** Off-plan groups named one by one before the rest are counted ("and 3 more parts off plan"). */
const MAX_NAMED_GROUPS = 4;

/** "a", "a and b", "a, b and c". */
function joinWords(words: readonly string[]): string {
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} and ${words.at(-1)}`;
}

/** Ascending numbers with runs of three or more shortened: [1, 2, 3, 5] → "1–3 and 5", [4, 6] → "4 and 6". */
export function joinNumbers(numbers: readonly number[]): string {
  const pieces: string[] = [];
  let i = 0;
  while (i < numbers.length) {
    let j = i;
    while (j + 1 < numbers.length && numbers[j + 1] === numbers[j]! + 1) j++;
    if (j - i >= 2) pieces.push(`${numbers[i]}–${numbers[j]}`);
    else for (let k = i; k <= j; k++) pieces.push(String(numbers[k]));
    i = j + 1;
  }
  return joinWords(pieces);
}

/** "4 of 6 reps on pace", "all 6 reps on pace", "the tempo part on pace"; null for a single part off pace (named later). */
function countClause(nouns: readonly [string, string], total: number, onPace: number): string | null {
  if (total === 1) return onPace === 1 ? `the ${nouns[0]} on pace` : null;
  if (onPace === total) return `all ${total} ${nouns[1]} on pace`;
  return `${onPace} of ${total} ${nouns[1]} on pace`;
}

/**
 * The session verdict as one sentence, counting the session's quality parts (reps, tempo, goal pace,
 * strides, steady; else all parts) and naming the parts off plan with their verdict and their number
 * among parts of the same kind. Parts are in the plan's order; the glyph is left to the caller.
 *
 * Examples:
 * - reps on pace except the 4th missed and the 6th quick, verdict "partly" →
 *   "Partly as planned: 4 of 6 reps on pace, rep 4 missed, rep 6 quick."
 * - every part on pace → "As planned: all 6 reps on pace."
 * - no parts, or verdict "unplanned" → "No session plan on this day."
 */
export function describeSession(parts: readonly DescribedPart[], verdict: SessionVerdict): string {
  if (verdict === 'unplanned' || parts.length === 0) return 'No session plan on this day.';

  const kindTotals = new Map<PartKind, number>();
  for (const part of parts) kindTotals.set(part.kind, (kindTotals.get(part.kind) ?? 0) + 1);
  const kindsInOrder = [...kindTotals.keys()];
  const keyKinds = kindsInOrder.filter((kind) => KEY_KINDS.includes(kind));

  const clauses: string[] = [];
  if (keyKinds.length > 0) {
    for (const kind of keyKinds) {
      const ofKind = parts.filter((p) => p.kind === kind);
      const clause = countClause(NOUNS[kind], ofKind.length, ofKind.filter((p) => p.verdict === 'on pace').length);
      if (clause) clauses.push(clause);
    }
  } else {
    const nouns = kindsInOrder.length === 1 ? NOUNS[kindsInOrder[0]!] : PART_NOUNS;
    const clause = countClause(
      nouns,
      parts.length,
      parts.filter((p) => p.verdict === 'on pace' || p.verdict === 'by feel').length,
    );
    if (clause) clauses.push(clause);
  }

  // Off-plan parts grouped by kind and verdict, quality kinds first. Repeated kinds (reps, recovery
  // jogs, strides) are numbered within their kind, as the table labels them ("rep 4 of 6"); any other
  // part by its row number in the table ("part 3").
  const groups = new Map<string, { kind: PartKind; verdict: string; numbers: number[] }>();
  const seen = new Map<PartKind, number>();
  parts.forEach((part, row) => {
    const number = REPEATED_KINDS.includes(part.kind) ? (seen.get(part.kind) ?? 0) + 1 : row + 1;
    seen.set(part.kind, (seen.get(part.kind) ?? 0) + 1);
    if (part.verdict === 'on pace' || part.verdict === 'by feel') return;
    const key = `${part.kind}|${part.verdict}`;
    const group = groups.get(key) ?? { kind: part.kind, verdict: part.verdict, numbers: [] };
    group.numbers.push(number);
    groups.set(key, group);
  });
  const ordered = [...groups.values()].sort((a, b) => Number(!KEY_KINDS.includes(a.kind)) - Number(!KEY_KINDS.includes(b.kind)));
  for (const group of ordered.slice(0, MAX_NAMED_GROUPS)) {
    const [one, many] = NOUNS[group.kind];
    const byRow = !REPEATED_KINDS.includes(group.kind);
    const name =
      kindTotals.get(group.kind) === 1
        ? one
        : byRow
          ? `${group.numbers.length === 1 ? 'part' : 'parts'} ${joinNumbers(group.numbers)} (${group.kind})`
          : `${group.numbers.length === 1 ? one : many} ${joinNumbers(group.numbers)}`;
    clauses.push(`${name} ${group.verdict}`);
  }
  const rest = ordered.slice(MAX_NAMED_GROUPS).reduce((n, g) => n + g.numbers.length, 0);
  if (rest > 0) clauses.push(`and ${rest} more ${rest === 1 ? 'part' : 'parts'} off plan`);

  const headline = SESSION_HEADLINES[verdict];
  return clauses.length > 0 ? `${headline}: ${clauses.join(', ')}.` : `${headline}.`;
}
