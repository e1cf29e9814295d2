import { describe, expect, it } from 'vitest';
import {
  batchDueAt,
  NOTE_BATCH_SECONDS,
  retryDelaySeconds,
  UPLOAD_BATCH_MAX_SECONDS,
  UPLOAD_QUIET_SECONDS,
} from '../../../../shared/notices/batching.ts';

const t0 = new Date('2026-12-05T06:00:00Z');
const at = (seconds: number) => new Date(t0.getTime() + seconds * 1000);

describe('batchDueAt', () => {
  it.each([
    ['one upload: a minute after it', 'import', [0], UPLOAD_QUIET_SECONDS],
    [
      'ten uploads within a minute: a minute after the last',
      'import',
      [0, 5, 12, 20, 31, 38, 44, 50, 55, 59],
      59 + UPLOAD_QUIET_SECONDS,
    ],
    [
      'a steady stream of uploads: at most ten minutes after the first',
      'import',
      [0, 50, 100, 150, 200, 250, 300, 350, 400, 450, 500, 550, 600],
      UPLOAD_BATCH_MAX_SECONDS,
    ],
    ['notes: fifteen minutes after the first, whatever comes later', 'note', [0, 60, 840], NOTE_BATCH_SECONDS],
    ['a pain alert: at once', 'pain_alert', [0], 0],
    ['a runner leaving: at once', 'squad_leave', [0], 0],
  ] as const)('%s', (_name, kind, seconds, dueSeconds) => {
    expect(batchDueAt(kind, seconds.map(at))).toEqual(at(dueSeconds));
  });

  it('reads the times in any order', () => {
    expect(batchDueAt('import', [at(30), at(0)])).toEqual(at(30 + UPLOAD_QUIET_SECONDS));
  });

  it('refuses an empty batch', () => {
    expect(() => batchDueAt('note', [])).toThrow(RangeError);
  });
});

describe('retryDelaySeconds', () => {
  it('doubles from one minute', () => {
    expect([1, 2, 3, 4].map(retryDelaySeconds)).toEqual([60, 120, 240, 480]);
  });
});
