import { describe, expect, it } from 'vitest';
import type { PartCheck } from '../../../../shared/plans/plan-check.ts';
import { repsLine, verdictReason } from '../../../../shared/weeks/verdict-reason.ts';

function part(index: number, kind: PartCheck['kind'], verdict: PartCheck['verdict'], over: Partial<PartCheck> = {}): PartCheck {
  return {
    index,
    kind,
    verdict,
    planned: { distance_m: 1000, pace_fast_s_per_km: 260, pace_slow_s_per_km: 265 },
    actual: { distance_m: 1000, duration_s: 262, pace_s_per_km: 262, avg_hr: null, start_t: 0, end_t: 262 },
    ...over,
  } as PartCheck;
}

describe('verdictReason', () => {
  it('says how far the goal-pace part was outside its range, in the reader’s unit', () => {
    // 40.4 s/km slower than the slow end; 40.4 × 1.609344 (km per international mile, NIST SP 811) = 65.02 s/mi.
    const slow = part(1, 'goal pace', 'slow', {
      actual: { distance_m: 8000, duration_s: 8 * 305.4, pace_s_per_km: 305.4, avg_hr: null, start_t: 0, end_t: 1 },
    });
    const check = { session_verdict: 'partly' as const, parts: [part(0, 'easy', 'on pace'), slow] };
    expect(verdictReason(check, 'mi')).toBe('goal-pace part +65 s/mi slow');
    expect(verdictReason(check, 'km')).toBe('goal-pace part +40 s/km slow');
  });

  it('names a missed rep by its number, before pace misses, and counts the rest', () => {
    const quick = part(2, 'rep', 'quick', {
      actual: { distance_m: 800, duration_s: 200, pace_s_per_km: 250, avg_hr: null, start_t: 0, end_t: 1 },
    });
    const parts = [
      part(0, 'rep', 'on pace'),
      part(1, 'recovery jog', 'slow'),
      quick,
      part(3, 'recovery jog', 'on pace'),
      part(4, 'rep', 'on pace'),
      part(5, 'recovery jog', 'on pace'),
      part(6, 'rep', 'missed'),
      part(7, 'cool-down', 'cut short', {
        planned: { distance_m: 2000 },
        actual: { distance_m: 1000, duration_s: 300, pace_s_per_km: 300, avg_hr: null, start_t: 0, end_t: 1 },
      }),
    ];
    // The missed rep is the fourth rep; 260 − 250 = 10 s/km quick; recoveries are left out while reps are off.
    expect(verdictReason({ session_verdict: 'partly', parts }, 'km')).toBe(
      'rep 4 missed; cool-down cut short (1.0 of 2.0 km) and 1 more',
    );
  });

  it('numbers parts of a kind that appears more than once and names recoveries only when nothing else is off', () => {
    const parts = [part(0, 'tempo', 'on pace'), part(1, 'recovery jog', 'missed'), part(2, 'tempo', 'on pace')];
    expect(verdictReason({ session_verdict: 'partly', parts }, 'km')).toBe('recovery missed');
    const tempo = [part(0, 'tempo', 'on pace'), part(1, 'tempo', 'missed')];
    expect(verdictReason({ session_verdict: 'partly', parts: tempo }, 'km')).toBe('tempo part 2 missed');
  });

  it('gives no reason for a session as planned or unplanned', () => {
    expect(verdictReason({ session_verdict: 'as planned', parts: [part(0, 'easy', 'on pace')] }, 'km')).toBeNull();
    expect(verdictReason({ session_verdict: 'unplanned', parts: [] }, 'km')).toBeNull();
  });
});

describe('repsLine', () => {
  it('lists rep paces, the time-weighted mean and the change from the first to the last rep', () => {
    const rep = (index: number, pace: number) =>
      part(index, 'rep', 'on pace', {
        actual: { distance_m: 1000, duration_s: pace, pace_s_per_km: pace, avg_hr: null, start_t: 0, end_t: 1 },
      });
    const parts = [rep(0, 200), part(1, 'recovery jog', 'on pace'), rep(2, 196), part(3, 'recovery jog', 'on pace'), rep(4, 192)];
    // Mean of 200, 196, 192 s over 1 km each = 588 s / 3 km = 196 s/km = 3:16; last − first = −8 s.
    expect(repsLine(parts, 'km')).toBe('3 reps: 3:20 3:16 3:12 /km · avg 3:16 · first→last −8 s');
    expect(repsLine([rep(0, 200)], 'km')).toBeNull();
    expect(repsLine([rep(0, 200), rep(1, 210), part(2, 'rep', 'missed')], 'km')).toBe(
      '3 reps: 3:20 3:30 /km · avg 3:25 · first→last +10 s · 1 not run',
    );
  });
});
