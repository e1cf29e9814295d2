import type { PartVerdict, SessionVerdict } from './plan-check.ts';

/**
 * How a verdict is shown: always a glyph and a word, never colour alone (product.md, design language).
 * Colours are hex so any surface (table, calendar, chart) can use them; `outline` marks the glyph that
 * is drawn as an outline (missed).
 */
export interface VerdictLook {
  glyph: string;
  word: string;
  colour: string;
  outline: boolean;
}

export type Verdict = PartVerdict | SessionVerdict;

/** Verdict colours from product.md's palette. */
export const VERDICT_COLOURS = {
  teal: '#0f766e',
  indigo: '#4338ca',
  ochre: '#a16207',
  slate: '#475569',
  /** The ink-muted tone, for "unplanned": no verdict, just a dash. */
  muted: '#545b69',
} as const;

/** Per part: on pace ● teal, quick ▲ indigo, slow ▼ ochre, cut short / extended ◐ slate, missed ○ slate outline, by feel ◇ slate. */
export const PART_VERDICT_LOOKS: Readonly<Record<PartVerdict, VerdictLook>> = {
  'on pace': { glyph: '●', word: 'on pace', colour: VERDICT_COLOURS.teal, outline: false },
  quick: { glyph: '▲', word: 'quick', colour: VERDICT_COLOURS.indigo, outline: false },
  slow: { glyph: '▼', word: 'slow', colour: VERDICT_COLOURS.ochre, outline: false },
  'cut short': { glyph: '◐', word: 'cut short', colour: VERDICT_COLOURS.slate, outline: false },
  extended: { glyph: '◐', word: 'extended', colour: VERDICT_COLOURS.slate, outline: false },
  missed: { glyph: '○', word: 'missed', colour: VERDICT_COLOURS.slate, outline: true },
  // An effort-only part: run as the runner felt it; no pace to be on (issue #14).
  'by feel': { glyph: '◇', word: 'by feel', colour: VERDICT_COLOURS.slate, outline: false },
};

/** Per session: as planned ● teal, partly ◐ slate, missed ○ slate outline, unplanned a plain dash. */
export const SESSION_VERDICT_LOOKS: Readonly<Record<SessionVerdict, VerdictLook>> = {
  'as planned': { glyph: '●', word: 'as planned', colour: VERDICT_COLOURS.teal, outline: false },
  partly: { glyph: '◐', word: 'partly', colour: VERDICT_COLOURS.slate, outline: false },
  missed: { glyph: '○', word: 'missed', colour: VERDICT_COLOURS.slate, outline: true },
  unplanned: { glyph: '–', word: 'unplanned', colour: VERDICT_COLOURS.muted, outline: false },
};

/** The look of a part or a session verdict ("missed" is both, and looks the same in both). */
export function verdictLook(verdict: Verdict): VerdictLook {
  return verdict in PART_VERDICT_LOOKS
    ? PART_VERDICT_LOOKS[verdict as PartVerdict]
    : SESSION_VERDICT_LOOKS[verdict as SessionVerdict];
}
