/**
 * The form builder's model of a session plan: the same items as `PlanItem`, but with every number
 * kept as the text the person typed, so a half-typed pace ("2:5") can sit in its field without
 * being lost or rewritten. `itemsToDraft` fills the form from a parsed plan; `draftToItems` reads
 * the form back, with a sentence per field that cannot be read.
 */
import { parseClockTime } from '../race/clock-time.ts';
import { formatDuration, formatPace } from '../tracks/format.ts';
import type { DistanceUnit, Part, PartKind, PartTarget, PacePer, PlanItem, RelativePaceRef } from './types.ts';
import { distanceFromWritten, distanceToWritten, paceFromWritten, paceToWritten } from './units.ts';

/** 'time' means the amount is a duration written m:ss or h:mm:ss. */
export type DraftAmountUnit = DistanceUnit | 'time';
export type DraftTargetType = PartTarget['type'];

export interface DraftPart {
  type: 'part';
  /** Stable while the form is edited, so React keeps each row (and its focus) when rows move. */
  id: string;
  kind: PartKind;
  amount: string;
  unit: DraftAmountUnit;
  target: DraftTargetType;
  /** Pace range as written, m:ss. */
  paceFast: string;
  paceSlow: string;
  pacePer: PacePer;
  ref: RelativePaceRef;
  /** Seconds slower (+) or quicker (−) than the race pace; blank for none. */
  offset: string;
  offsetPer: 'mi' | 'km';
  hrLow: string;
  hrHigh: string;
}

export interface DraftRepeat {
  type: 'repeat';
  id: string;
  count: string;
  parts: DraftPart[];
}

export type DraftItem = DraftPart | DraftRepeat;

/** The fields of a new part; `id` comes from the caller (the form's counter). */
export function newDraftPart(id: string, overrides: Partial<Omit<DraftPart, 'id' | 'type'>> = {}): DraftPart {
  return {
    type: 'part',
    id,
    kind: 'easy',
    amount: '1',
    unit: 'mi',
    target: 'effort',
    paceFast: '',
    paceSlow: '',
    pacePer: 'mi',
    ref: 'goal',
    offset: '',
    offsetPer: 'mi',
    hrLow: '',
    hrHigh: '',
    ...overrides,
  };
}

function partToDraft(part: Part, id: string): DraftPart {
  const a = part.amount;
  const amount =
    a.type === 'distance'
      ? { amount: String(distanceToWritten(a.distance_m, a.unit)), unit: a.unit }
      : { amount: formatDuration(a.duration_s), unit: 'time' as const };
  const d = a.type === 'distance' ? a.distance_m : null;
  const t = part.target;
  const draft = newDraftPart(id, { kind: part.kind, ...amount, target: t.type });
  switch (t.type) {
    case 'pace':
      return {
        ...draft,
        pacePer: t.per,
        paceFast: formatPace(Math.round(paceToWritten(t.fast_s_per_km, t.per, d))),
        paceSlow: formatPace(Math.round(paceToWritten(t.slow_s_per_km, t.per, d))),
      };
    case 'relative':
      return {
        ...draft,
        ref: t.ref,
        offset: t.offset ? signed(Math.round(paceToWritten(t.offset.s_per_km, t.offset.per, null))) : '',
        offsetPer: t.offset?.per ?? 'mi',
      };
    case 'heart_rate':
      return { ...draft, hrLow: String(t.low_bpm), hrHigh: String(t.high_bpm) };
    case 'effort':
      return draft;
  }
}

function signed(n: number): string {
  return n > 0 ? `+${n}` : String(n);
}

/** The form's rows for parsed items; `nextId` gives each row and repeat its key. Inputs are not mutated. */
export function itemsToDraft(items: readonly PlanItem[], nextId: () => string): DraftItem[] {
  return items.map((item) =>
    item.type === 'part'
      ? partToDraft(item, nextId())
      : { type: 'repeat', id: nextId(), count: String(item.count), parts: item.parts.map((p) => partToDraft(p, nextId())) },
  );
}

/** Problems keyed `${row id}.${field}` (fields: amount, count, paceFast, paceSlow, offset, hrLow, hrHigh). */
export type DraftErrors = Record<string, string>;

export type DraftResult = { ok: true; items: PlanItem[] } | { ok: false; errors: DraftErrors };

const NUMBER = /^\d+(\.\d+)?$/;
const WHOLE = /^\d+$/;
const SIGNED_WHOLE = /^[+-]?\d+$/;

function readPart(p: DraftPart, errors: DraftErrors): Part | null {
  const before = Object.keys(errors).length;
  const problem = (field: string, message: string) => {
    errors[`${p.id}.${field}`] = message;
  };
  let amount: Part['amount'] | null = null;
  const amountText = p.amount.trim();
  if (p.unit === 'time') {
    const s = parseClockTime(amountText);
    if (s === null || s < 1) problem('amount', 'Write a time as m:ss or h:mm:ss, e.g. 45:00.');
    else amount = { type: 'duration', duration_s: Math.round(s) };
  } else if (!NUMBER.test(amountText) || Number(amountText) <= 0) {
    problem('amount', `Write a distance in ${p.unit} as a number more than 0, e.g. 2 or 0.5.`);
  } else {
    amount = { type: 'distance', distance_m: distanceFromWritten(Number(amountText), p.unit), unit: p.unit };
  }

  let target: PartTarget | null = null;
  switch (p.target) {
    case 'effort':
      target = { type: 'effort' };
      break;
    case 'pace': {
      const fast = parseClockTime(p.paceFast);
      const slowText = p.paceSlow.trim() === '' ? p.paceFast : p.paceSlow;
      const slow = parseClockTime(slowText);
      if (fast === null) problem('paceFast', 'Write the fast end of the pace as m:ss, e.g. 7:05.');
      if (slow === null) problem('paceSlow', 'Write the slow end of the pace as m:ss, e.g. 7:15 (or leave it blank).');
      if (p.pacePer === 'rep' && p.unit === 'time') {
        problem('paceFast', 'A time for the whole part needs a distance: choose per mi or per km for a timed part.');
      } else if (fast !== null && slow !== null && amount) {
        const d = amount.type === 'distance' ? amount.distance_m : null;
        target = {
          type: 'pace',
          fast_s_per_km: paceFromWritten(fast, p.pacePer, d),
          slow_s_per_km: paceFromWritten(slow, p.pacePer, d),
          per: p.pacePer,
        };
      }
      break;
    }
    case 'relative': {
      const text = p.offset.trim();
      if (text !== '' && !SIGNED_WHOLE.test(text)) {
        problem('offset', 'Write the offset in whole seconds, e.g. +10 or -5, or leave it blank.');
      } else if (text === '' || Number(text) === 0) {
        target = { type: 'relative', ref: p.ref };
      } else {
        target = {
          type: 'relative',
          ref: p.ref,
          offset: { s_per_km: paceFromWritten(Number(text), p.offsetPer, null), per: p.offsetPer },
        };
      }
      break;
    }
    case 'heart_rate': {
      const lowText = p.hrLow.trim();
      const highText = p.hrHigh.trim() === '' ? lowText : p.hrHigh.trim();
      if (!WHOLE.test(lowText)) problem('hrLow', 'Write a heart rate in whole beats per minute, e.g. 140.');
      if (!WHOLE.test(highText)) problem('hrHigh', 'Write a heart rate in whole beats per minute, e.g. 150 (or leave it blank).');
      if (WHOLE.test(lowText) && WHOLE.test(highText)) {
        target = { type: 'heart_rate', low_bpm: Number(lowText), high_bpm: Number(highText) };
      }
      break;
    }
  }
  if (Object.keys(errors).length > before || !amount || !target) return null;
  return { type: 'part', kind: p.kind, amount, target };
}

/**
 * Reads the form into plan items. Only checks that each field can be read (numbers, m:ss times);
 * limits and ranges (a pace of 0:00, 99 repeats) are left to `parseShorthand`, which the caller
 * runs on the formatted result so the form and the shorthand give the same messages. An empty
 * form gives `{ok: true, items: []}`. Inputs are not mutated.
 */
export function draftToItems(draft: readonly DraftItem[]): DraftResult {
  const errors: DraftErrors = {};
  const items: PlanItem[] = [];
  for (const item of draft) {
    if (item.type === 'part') {
      const part = readPart(item, errors);
      if (part) items.push(part);
      continue;
    }
    const countText = item.count.trim();
    if (!WHOLE.test(countText) || Number(countText) < 1) {
      errors[`${item.id}.count`] = 'Write how many times, a whole number from 1.';
    }
    if (item.parts.length === 0) errors[`${item.id}.count`] = 'A repeat needs at least one part: add one or delete the repeat.';
    const parts = item.parts.map((p) => readPart(p, errors)).filter((p): p is Part => p !== null);
    items.push({ type: 'repeat', count: Number(countText), parts });
  }
  return Object.keys(errors).length > 0 ? { ok: false, errors } : { ok: true, items };
}

/** `list` with the entry at `index` moved `by` places (−1 up, +1 down); unchanged when it would leave the list. */
export function moveEntry<T>(list: readonly T[], index: number, by: -1 | 1): T[] {
  const to = index + by;
  if (index < 0 || index >= list.length || to < 0 || to >= list.length) return [...list];
  const out = [...list];
  [out[index], out[to]] = [out[to] as T, out[index] as T];
  return out;
}
