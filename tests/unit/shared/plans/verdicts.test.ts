import { describe, expect, it } from 'vitest';
import type { PartVerdict, SessionVerdict } from '../../../../shared/plans/plan-check.ts';
import { PART_VERDICT_LOOKS, SESSION_VERDICT_LOOKS, verdictLook } from '../../../../shared/plans/verdicts.ts';

describe('verdict looks (product.md, design language)', () => {
  it.each<[PartVerdict, string, string]>([
    ['on pace', '●', '#0f766e'],
    ['quick', '▲', '#4338ca'],
    ['slow', '▼', '#a16207'],
    ['cut short', '◐', '#475569'],
    ['extended', '◐', '#475569'],
    ['missed', '○', '#475569'],
  ])('part verdict "%s" is %s in %s, with its word', (verdict, glyph, colour) => {
    expect(PART_VERDICT_LOOKS[verdict]).toMatchObject({ glyph, colour, word: verdict });
    expect(verdictLook(verdict)).toBe(PART_VERDICT_LOOKS[verdict]);
  });

  it.each<[SessionVerdict, string]>([
    ['as planned', '●'],
    ['partly', '◐'],
    ['missed', '○'],
    ['unplanned', '–'],
  ])('session verdict "%s" is %s, with its word', (verdict, glyph) => {
    expect(SESSION_VERDICT_LOOKS[verdict]).toMatchObject({ glyph, word: verdict });
    expect(verdictLook(verdict).glyph).toBe(glyph);
  });

  it('only "missed" is drawn as an outline', () => {
    const outlined = Object.values({ ...PART_VERDICT_LOOKS, ...SESSION_VERDICT_LOOKS }).filter((l) => l.outline);
    expect(outlined.map((l) => l.word)).toEqual(['missed']);
  });

  it('never tells two verdicts apart by colour alone: each glyph and word pair is unique', () => {
    for (const table of [PART_VERDICT_LOOKS, SESSION_VERDICT_LOOKS]) {
      const pairs = Object.values(table).map((l) => `${l.glyph} ${l.word}`);
      expect(new Set(pairs).size).toBe(pairs.length);
    }
    // "missed" is both a part and a session verdict, and looks the same in both.
    expect(PART_VERDICT_LOOKS.missed).toEqual(SESSION_VERDICT_LOOKS.missed);
  });
});
