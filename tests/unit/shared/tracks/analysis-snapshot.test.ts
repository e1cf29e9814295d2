/**
 * The analysis gives exactly the results it gave before it was made faster (issue 19, session 8): on
 * every sample file, the bench's generated files at a small size and generated tracks of every kind
 * (tests/support/analysis-snapshot.ts), summaries, splits and fastest sections equal the stored ones bit
 * for bit and every per-point series has the same SHA-256. The stored file was written by main at
 * 5780b0e, before the analysis was rewritten over columns.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fingerprintCase, snapshotCases } from '../../../support/analysis-snapshot.ts';

const stored = JSON.parse(readFileSync(new URL('./analysis-snapshot.json', import.meta.url), 'utf8')) as Record<string, unknown>;
const cases = snapshotCases();

describe('analysis of every sample file equals the stored snapshot', () => {
  it('covers every stored case, smoothed and not, and nothing else', () => {
    expect(cases.map((c) => c.name).sort()).toEqual(Object.keys(stored).sort());
    // The set reaches every branch of the distance: smoothed, raw geodesic, sparse, device.
    const text = JSON.stringify(stored);
    expect(text).toContain('"smoothed":true');
    expect(text).toContain('"source":"device"');
    expect(text).toContain('"median_interval_s":5');
  });

  it.each(cases.map((c) => [c.name, c] as const))('%s', (name, testCase) => {
    expect(fingerprintCase(testCase)).toEqual(stored[name]);
  });
});
