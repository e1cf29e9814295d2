import { describe, expect, it } from 'vitest';
import { isClosingRecovery } from '../../../../shared/plans/closing-recovery.ts';
import { expandParts, resolveTargets } from '../../../../shared/plans/expand.ts';
import {
  checkRunAgainstPlan,
  judgePart,
  sessionVerdict,
  type CheckLap,
  type CheckedPart,
  type PartCheck,
} from '../../../../shared/plans/plan-check.ts';
import { parseShorthand } from '../../../../shared/plans/shorthand.ts';
import type { RacePaces } from '../../../../shared/plans/types.ts';
import { analyseTrack } from '../../../../shared/tracks/analyse.ts';
import { cleanTrack } from '../../../../shared/tracks/clean.ts';
import { generateLakeRun, type Phase, type SyntheticOptions } from '../../../../shared/tracks/synthetic.ts';

const START = Date.UTC(2026, 9, 3, 12);

function planParts(text: string, paces: RacePaces = {}): CheckedPart[] {
  const parsed = parseShorthand(text);
  if (!parsed.ok) throw new Error(parsed.error.message);
  return resolveTargets(expandParts(parsed.items), paces);
}

/** A run made of constant-speed stretches of given distances (m) at given speeds (m/s). */
function phasesFor(stretches: Array<[number, number]>): Phase[] {
  return stretches.map(([metres, speed]) => ({ kind: 'run', duration_s: metres / speed, speed_mps: speed }));
}

function seriesOf(phases: Phase[], gps = 0) {
  const options: SyntheticOptions = { start_t: START, phases, seed: 9, gps_sigma_m: gps };
  return analyseTrack(cleanTrack([generateLakeRun(options).points])).series;
}

const WORKOUT = '2 km warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 km cool-down';
// 2:57.5 per 800 m is the middle of the range: 800 / 177.5 = 4.507 m/s.
const REP = 800 / 177.5;
const JOG = 2.2;

function workoutStretches(overrides: { warmUp?: number; repSpeeds?: number[] } = {}): Array<[number, number]> {
  const stretches: Array<[number, number]> = [[overrides.warmUp ?? 2000, 3.0]];
  for (let i = 0; i < 6; i++) stretches.push([800, overrides.repSpeeds?.[i] ?? REP], [400, JOG]);
  stretches.push([2000, 2.9]);
  return stretches;
}

const verdicts = (parts: PartCheck[]) => parts.map((p) => p.verdict);
/** Every part run as written: on pace, or "by feel" for effort-only parts (no pace to be on). */
const asWritten = (parts: readonly CheckedPart[]) =>
  parts.filter((_, i) => !isClosingRecovery(parts, i)).map((p) => (p.resolved.type === 'effort' ? 'by feel' : 'on pace'));

describe('checkRunAgainstPlan on generated tracks', () => {
  it('a workout run exactly as written: every part on pace, session as planned', () => {
    const parts = planParts(WORKOUT);
    expect(parts).toHaveLength(14);
    const result = checkRunAgainstPlan(parts, seriesOf(phasesFor(workoutStretches())), []);
    expect(result.method).toBe('planned amounts');
    expect(verdicts(result.parts)).toEqual(asWritten(parts));
    // Warm-up, the five recoveries between the six reps and the cool-down have no pace target: run by
    // feel. The jog after rep 6 (run here before the cool-down) was not written and has no row.
    expect(result.parts).toHaveLength(13);
    expect(verdicts(result.parts).filter((v) => v === 'by feel')).toHaveLength(7);
    expect(result.parts.at(-1)!.kind).toBe('cool-down');
    expect(result.session_verdict).toBe('as planned');
    // Reps at 2:57.5 per 800 m = 221.9 s/km, inside 218.75–225 s/km.
    for (const rep of result.parts.filter((p) => p.kind === 'rep')) expect(rep.actual.pace_s_per_km).toBeCloseTo(221.9, 0);
  });

  it('reps that start 150 m late (a long warm-up) still match, with GPS noise', () => {
    const result = checkRunAgainstPlan(planParts(WORKOUT), seriesOf(phasesFor(workoutStretches({ warmUp: 2150 })), 1.5), []);
    expect(verdicts(result.parts)).toEqual(asWritten(planParts(WORKOUT)));
    expect(result.parts[0]!.actual.distance_m).toBeGreaterThan(2100);
    for (const rep of result.parts.filter((p) => p.kind === 'rep'))
      expect(Math.abs(rep.actual.distance_m - 800)).toBeLessThan(40);
  });

  it('a skipped rep (jogged at recovery pace) is "missed" and the session is "partly"', () => {
    const result = checkRunAgainstPlan(
      planParts(WORKOUT),
      seriesOf(phasesFor(workoutStretches({ repSpeeds: [REP, REP, REP, JOG, REP, REP] }))),
      [],
    );
    const reps = result.parts.filter((p) => p.kind === 'rep');
    expect(reps.map((r) => r.verdict)).toEqual(['on pace', 'on pace', 'on pace', 'missed', 'on pace', 'on pace']);
    expect(reps[3]!.note).toMatch(/skipped/);
    expect(result.session_verdict).toBe('partly');
  });

  it('a rep run too fast is "quick" and one too slow is "slow", with the difference from the range', () => {
    const result = checkRunAgainstPlan(
      planParts(WORKOUT),
      seriesOf(phasesFor(workoutStretches({ repSpeeds: [REP, 4.9, REP, 4.2, REP, REP] }))),
      [],
    );
    const reps = result.parts.filter((p) => p.kind === 'rep');
    expect(reps.map((r) => r.verdict)).toEqual(['on pace', 'quick', 'on pace', 'slow', 'on pace', 'on pace']);
    // 4.9 m/s = 204.1 s/km, 14.6 s/km quicker than the fast end (218.75).
    expect(reps[1]!.difference_s_per_km).toBeCloseTo(204.08 - 218.75, 0);
    expect(reps[3]!.difference_s_per_km!).toBeGreaterThan(0);
  });

  it('a long run with a block at goal pace resolves "@ MP" against the goal', () => {
    // Goal marathon pace 4:30/km = 270 s/km; the block is run at 1000/270 = 3.704 m/s.
    const parts = planParts('5 km easy, 10 km @ MP, 2 km cool-down', { MP: 270 });
    const run = seriesOf(
      phasesFor([
        [5000, 3.0],
        [10000, 1000 / 270],
        [2000, 3.0],
      ]),
      1,
    );
    const result = checkRunAgainstPlan(parts, run, []);
    expect(verdicts(result.parts)).toEqual(['by feel', 'on pace', 'by feel']);
    expect(result.parts[1]!.actual.pace_s_per_km).toBeCloseTo(270, -1);
  });

  it('a run that stops early leaves the last parts cut short or missed', () => {
    const parts = planParts('3 km easy, 5 km @ 4:30/km, 2 km cool-down');
    const run = seriesOf(
      phasesFor([
        [3000, 3.0],
        [2500, 1000 / 270],
      ]),
    );
    const result = checkRunAgainstPlan(parts, run, []);
    expect(verdicts(result.parts)).toEqual(['by feel', 'cut short', 'missed']);
    expect(result.session_verdict).toBe('partly');
  });

  it('a device-lap workout aligns by its laps', () => {
    const stretches = workoutStretches({ warmUp: 2150 });
    const phases = phasesFor(stretches);
    let t = START;
    const laps: CheckLap[] = phases.map((p, i) => {
      const lap = { start_t: t, total_time_s: p.duration_s, distance_m: stretches[i]![0] };
      t += p.duration_s * 1000;
      return lap;
    });
    const result = checkRunAgainstPlan(planParts(WORKOUT), seriesOf(phases, 1.5), laps);
    expect(result.method).toBe('device laps');
    expect(verdicts(result.parts)).toEqual(asWritten(planParts(WORKOUT)));
    expect(result.parts[1]!.actual.start_t).toBe(laps[1]!.start_t);
  });

  it('laps that do not fit the parts (auto-laps every km) are ignored in favour of cutting', () => {
    const series = seriesOf(phasesFor([[10000, 3.0]]));
    const autoLaps: CheckLap[] = Array.from({ length: 10 }, (_, k) => ({
      start_t: START + k * 333_333,
      total_time_s: 333.3,
      distance_m: 1000,
    }));
    const result = checkRunAgainstPlan(planParts('10 km easy'), series, autoLaps);
    expect(result.method).toBe('planned amounts');
    expect(result.session_verdict).toBe('as planned');
  });
});

describe('judgePart', () => {
  const [part] = planParts('1 km @ 4:00-4:10/km');
  const actual = (distance: number, pace: number) => ({
    distance_m: distance,
    duration_s: (distance / 1000) * pace,
    moving_s: (distance / 1000) * pace,
    stops: { count: 0, seconds: 0 },
    pace_s_per_km: pace,
    avg_hr: null,
    start_t: 0,
    end_t: 1,
  });
  it.each([
    [1000, 245, 'on pace'], // 4:05 inside the range
    [1000, 236, 'on pace'], // 240 − 2 % = 235.2: inside the tolerance
    [1000, 235, 'quick'],
    [1000, 255, 'on pace'], // 250 + 2 % = 255
    [1000, 256, 'slow'],
    [899, 245, 'cut short'], // under 90 % of the amount (product.md)
    [1101, 245, 'extended'], // over 110 %
  ] as const)('%s m at %s s/km → %s', (distance, pace, verdict) => {
    expect(judgePart(part!, actual(distance, pace), 0.02).verdict).toBe(verdict);
  });
});

describe('sessionVerdict', () => {
  const v = (...verdicts: PartCheck['verdict'][]) => verdicts.map((verdict) => ({ verdict }) as PartCheck);
  it.each([
    [v(), 'unplanned'],
    [v('on pace', 'on pace'), 'as planned'],
    [v('on pace', 'slow'), 'partly'],
    [v('missed', 'cut short', 'slow'), 'missed'],
    [v('slow', 'quick'), 'partly'],
  ] as const)('%j → %s', (parts, expected) => {
    expect(sessionVerdict(parts)).toBe(expected);
  });
});

describe('a recovery after the last rep exists only when written (issue #14)', () => {
  // Trade usage: "6 x 3 min w/ 90 s jog" has a recovery between reps, five in all; one after the
  // last rep is written as its own part (common practice in written sessions, our reading).
  it('"w/" recoveries: the one closing the last round is not written; a separate one after the repeat is', () => {
    const unwritten = (text: string) => {
      const parts = planParts(text);
      return parts.flatMap((p, i) => (isClosingRecovery(parts, i) ? [p.index] : []));
    };
    expect(unwritten('6 x 3 min @ 3:40/km w/ 90 s jog')).toEqual([11]);
    expect(unwritten('2 km warm-up, 6 x 800 m w/ 400 m jog, 2 km cool-down')).toEqual([12]);
    // Written after the repeat: the repeat's own closing recovery is still unwritten, the extra part is not.
    expect(unwritten('6 x 800 m w/ 400 m jog, 400 m jog')).toEqual([11]);
    expect(unwritten('6 x 800 m, 400 m jog')).toEqual([]);
    expect(unwritten('10 x 200 m strides')).toEqual([]);
  });

  it('"6 x 3 min … w/ 90 s jog" run with no jog after rep 6: six reps on pace, five recoveries, nothing missed', () => {
    const parts = planParts('6 x 3 min @ 3:40/km w/ 90 s jog');
    const rep = 1000 / 220;
    const phases: Phase[] = [];
    for (let i = 0; i < 6; i++) {
      phases.push({ kind: 'run', duration_s: 180, speed_mps: rep });
      if (i < 5) phases.push({ kind: 'run', duration_s: 90, speed_mps: 2.2 });
    }
    const result = checkRunAgainstPlan(parts, seriesOf(phases), []);
    expect(result.parts.map((p) => p.kind)).toEqual([...Array.from({ length: 5 }, () => ['rep', 'recovery jog']).flat(), 'rep']);
    expect(verdicts(result.parts).filter((v) => v === 'missed' || v === 'cut short')).toEqual([]);
    expect(result.session_verdict).toBe('as planned');
  });

  it('the same session with a 4 min walk-jog after rep 6: the last rep ends at its 3 min, the rest is not judged', () => {
    const parts = planParts('6 x 3 min @ 3:40/km w/ 90 s jog');
    const rep = 1000 / 220;
    const phases: Phase[] = [];
    for (let i = 0; i < 6; i++)
      phases.push({ kind: 'run', duration_s: 180, speed_mps: rep }, { kind: 'run', duration_s: i < 5 ? 90 : 240, speed_mps: 2 });
    const result = checkRunAgainstPlan(parts, seriesOf(phases), []);
    expect(result.parts).toHaveLength(11);
    const last = result.parts.at(-1)!;
    expect(last.kind).toBe('rep');
    expect(last.verdict).toBe('on pace');
    expect(Math.abs(last.actual.duration_s - 180)).toBeLessThan(5);
  });
});
