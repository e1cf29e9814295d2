import { describe, expect, it } from 'vitest';
import { CAUTION_TOPICS, CAUTIONS, cautionsFor, coldWaterNotes, LAST_WORD } from '../../../../shared/fuel/cautions.ts';

describe('cautions', () => {
  it.each(CAUTION_TOPICS)('%s names a source and who has the last word', (topic) => {
    const c = CAUTIONS[topic];
    expect(c.source.length).toBeGreaterThan(20);
    expect(c.last_word).toMatch(/physician/);
  });

  it('fluid cites Hew-Butler 2015 and Sawka 2007 and warns against drinking beyond thirst', () => {
    expect(CAUTIONS.fluid.source).toContain('Hew-Butler et al. 2015');
    expect(CAUTIONS.fluid.source).toContain('Sawka et al. 2007');
    expect(CAUTIONS.fluid.text).toMatch(/thirst/);
    expect(CAUTIONS.fluid.last_word).toBe(LAST_WORD);
    expect(LAST_WORD).toBe(
      'A physician, a registered dietitian or a qualified coach has the last word for you as an individual.',
    );
  });

  it('caffeine proposes no dose (REFERENCES.md has no published range)', () => {
    expect(CAUTIONS.caffeine.text).toMatch(/does not propose a dose/);
    expect(CAUTIONS.caffeine.text).not.toMatch(/mg\/kg/);
  });

  it('cold water: cold shock, heart conditions, the studied 10–15 °C for 10–15 min, and a physician decides', () => {
    const c = CAUTIONS['cold water'];
    expect(c.text).toMatch(/cold-shock/);
    expect(c.text).toMatch(/heart disease or high blood pressure/);
    expect(c.text).toMatch(/10–15 °C for 10–15 minutes/);
    expect(c.source).toContain('Machado et al. 2016');
    expect(c.source).toContain('Datta & Tipton 2006');
    expect(c.last_word).toMatch(/physician decides/);
  });

  it('cautionsFor keeps a fixed order and no duplicates', () => {
    expect(cautionsFor(['sodium', 'fluid', 'sodium']).map((c) => c.topic)).toEqual(['fluid', 'sodium']);
    expect(cautionsFor([])).toEqual([]);
  });

  it.each([
    [12, 12, []],
    [10, 15, []],
    [8, 12, ['Colder than the 10–15 °C the pooled studies used.']],
    [20, 20, ['Warmer than the 10–15 °C the pooled studies used.', 'Longer than the 10–15 minutes the pooled studies used.']],
  ])('cold water at %d °C for %d min: %j', (temp, minutes, notes) => {
    expect(coldWaterNotes(temp, minutes)).toEqual(notes);
  });

  it('refuses a negative time in the water', () => {
    expect(() => coldWaterNotes(12, -1)).toThrow(RangeError);
  });
});
