import { describe, expect, it } from 'vitest';
import { groupForDigest, overviewToCsv, weekToCsv } from '../../../../shared/weeks/csv.ts';

describe('weekToCsv', () => {
  it('writes one row per plan and per run', () => {
    const csv = weekToCsv([
      {
        date: '2026-11-23',
        plans: [{ title: 'Easy', planned_distance_m: 8046.72, planned_duration_s: null }],
        runs: [{ name: 'Lake loop', distance_m: 8100.4, moving_s: 2700.2, session_verdict: 'as planned', trimp: 61.7 }],
      },
      { date: '2026-11-24', plans: [], runs: [] },
    ]);
    expect(csv.split('\r\n')).toEqual([
      'date,entry,title,planned_distance_m,planned_duration_s,run_distance_m,moving_s,verdict,trimp',
      '2026-11-23,plan,Easy,8047,,,,,',
      '2026-11-23,run,Lake loop,,,8100,2700,as planned,62',
      '',
    ]);
  });
});

describe('overviewToCsv and groupForDigest', () => {
  const row = (name: string, run: number, flags: string[]) => ({
    runner: { name },
    start: '2026-11-23',
    planned_distance_m: 40000,
    run_distance_m: run,
    moving_s: run / 3,
    sessions_planned: 5,
    sessions_as_planned: 4,
    flags: flags.map((code) => ({ code })),
    last_upload: null,
    reviewed: false,
  });
  it('lists flags by code', () => {
    expect(overviewToCsv([row('Ivy', 42000, ['volume-jump', 'load-spike'])]).split('\r\n')[1]).toBe(
      'Ivy,2026-11-23,40000,42000,14000,5,4,volume-jump load-spike,,no',
    );
  });
  it('puts each runner under one heading: no upload before flagged before on plan', () => {
    const groups = groupForDigest([row('A', 0, ['long-run-missed']), row('B', 30000, ['volume-jump']), row('C', 30000, [])]);
    expect([groups.no_upload, groups.flagged, groups.on_plan].map((g) => g.map((r) => r.runner.name))).toEqual([
      ['A'],
      ['B'],
      ['C'],
    ]);
  });
  it('keeps a runner with no plan out of "on plan", and counts soreness and missed key sessions as something to look at', () => {
    const noPlan = { ...row('D', 24300, []), sessions_planned: 0, planned_distance_m: 0 };
    const sore = { ...row('E', 30000, []), high_soreness: 1 };
    const missedKey = { ...row('F', 30000, []), missed_key_sessions: 1 };
    const groups = groupForDigest([noPlan, sore, missedKey, row('G', 30000, [])]);
    expect(groups.no_plan.map((r) => r.runner.name)).toEqual(['D']);
    expect(groups.flagged.map((r) => r.runner.name)).toEqual(['E', 'F']);
    expect(groups.on_plan.map((r) => r.runner.name)).toEqual(['G']);
  });
});
