import { describe, expect, it } from 'vitest';
import { MAX_SLUG_LENGTH, runFileName, slugify } from '../../../../shared/runs/file-names.ts';

describe('slugify', () => {
  it.each([
    ['Lake Tamsel long run', 'lake-tamsel-long-run'],
    ['Tomás’s Lake Loop!', 'tomass-lake-loop'],
    ['  6 × 3 min with jog recoveries ', '6-3-min-with-jog-recoveries'],
    ['Crème brûlée 10K', 'creme-brulee-10k'],
    ['!!!', 'run'],
    ['', 'run'],
    ['../../etc/passwd', 'etc-passwd'],
  ])('%j → %j', (name, slug) => {
    expect(slugify(name)).toBe(slug);
  });

  it(`keeps at most ${MAX_SLUG_LENGTH} characters, cut at a hyphen`, () => {
    const slug = slugify('very long name '.repeat(20));
    expect(slug.length).toBeLessThanOrEqual(MAX_SLUG_LENGTH);
    expect(slug.endsWith('-')).toBe(false);
    expect(slug.startsWith('very-long-name-very')).toBe(true);
  });
});

describe('runFileName', () => {
  it('puts the date and the name first (issue 17)', () => {
    expect(runFileName('2026-12-04', 'Lake Tamsel long run', 'splits-mi', 'csv')).toBe(
      '2026-12-04-lake-tamsel-long-run-splits-mi.csv',
    );
  });
});
