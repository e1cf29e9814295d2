import { describe, expect, it } from 'vitest';
import { expandParts } from '../../../../shared/plans/expand.ts';
import { formatRepBlock } from '../../../../shared/plans/plan-check-display.ts';
import type { PartCheck } from '../../../../shared/plans/plan-check.ts';
import { repBlocks } from '../../../../shared/plans/rep-blocks.ts';
import { parseShorthand } from '../../../../shared/plans/shorthand.ts';

function expanded(text: string) {
  const parsed = parseShorthand(text);
  if (!parsed.ok) throw new Error(parsed.error.message);
  return expandParts(parsed.items);
}

/** A checked row: `metres` run in `seconds` of moving time. */
function row(index: number, kind: PartCheck['kind'], verdict: PartCheck['verdict'], metres: number, seconds: number) {
  return {
    index,
    kind,
    verdict,
    actual: {
      distance_m: metres,
      duration_s: seconds,
      moving_s: seconds,
      pace_s_per_km: metres > 0 ? seconds / (metres / 1000) : null,
      avg_hr: null,
      start_t: 0,
      end_t: 0,
    },
  };
}

describe('repBlocks', () => {
  // "2 km warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog": warm-up is index 0, reps 1, 3, …, 11.
  const planned = expanded('2 km warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 km cool-down');
  const repSeconds = [178, 177, 179, 0, 184, 176];
  const checked = [
    row(0, 'warm-up', 'by feel', 2000, 660),
    ...repSeconds.flatMap((s, k) => [
      k === 3 ? row(1 + 2 * k, 'rep', 'missed', 800, 300) : row(1 + 2 * k, 'rep', s > 180 ? 'slow' : 'on pace', 800, s),
      row(2 + 2 * k, 'recovery jog', 'by feel', 400, 180),
    ]),
  ].filter((r) => r.index !== 12);

  it('one block per repeated step: reps, run, on pace; a missed rep counts but has no pace', () => {
    const [block, ...rest] = repBlocks(planned, checked);
    expect(rest).toEqual([]);
    expect(block).toMatchObject({ item_index: 1, step: 0, kind: 'rep', reps: 6, run: 5, on_pace: 4 });
    expect(block!.amount).toEqual({ distance_m: 800, unit: 'm' });
    // 178 s per 800 m = 222.5 s/km.
    expect(block!.paces_s_per_km[0]).toBeCloseTo(222.5, 6);
    expect(block!.paces_s_per_km[3]).toBeNull();
    // Average by moving time over distance: (178+177+179+184+176) s / 4 km = 223.5 s/km.
    expect(block!.average_s_per_km).toBeCloseTo(894 / 4, 6);
    expect(block!.fastest_s_per_km).toBeCloseTo(176 / 0.8, 6);
    expect(block!.slowest_s_per_km).toBeCloseTo(184 / 0.8, 6);
    // First (178 s) to last (176 s) rep: −2 s per 800 m = −2.5 s/km.
    expect(block!.first_to_last_s_per_km).toBeCloseTo(-2.5, 6);
  });

  it('the line in km and in miles (1 mi = 1609.344 m exactly, shared/REFERENCES.md §1)', () => {
    const [block] = repBlocks(planned, checked);
    expect(formatRepBlock(block!, 'km')).toBe(
      '6 × 800 m: 4 of 6 on pace · 3:43 3:41 3:44 – 3:50 3:40 /km · average 3:44 · fastest 3:40, slowest 3:50 · first to last −3 s',
    );
    // 222.5 s/km × 1.609344 = 358.08 s/mi = 5:58; −2.5 s/km = −4.0 s/mi.
    expect(formatRepBlock(block!, 'mi')).toMatch(/^6 × 800 m: 4 of 6 on pace · 5:58 .* \/mi · .*first to last −4 s$/);
  });

  it('timed reps, and several steps in a round give one block each; single parts and recoveries none', () => {
    const plan = expanded('3 x (3 min @ 3:40/km, 1 min @ 3:20/km, 2 min jog), 10 min easy');
    const rows = plan.map((p) => row(p.index, p.kind, 'on pace', p.kind === 'rep' ? 800 : 300, 180));
    const blocks = repBlocks(plan, rows);
    expect(blocks.map((b) => [b.step, b.reps, b.amount])).toEqual([
      [0, 3, { duration_s: 180 }],
      [1, 3, { duration_s: 60 }],
    ]);
    expect(formatRepBlock(blocks[1]!, 'km')).toMatch(/^3 × 1:00: 3 of 3 on pace · /);
    expect(blocks[0]!.first_to_last_s_per_km).toBe(0);
    expect(formatRepBlock(blocks[0]!, 'km')).toMatch(/first to last 0$/);
  });

  it('no reps run: says so, with no paces', () => {
    const plan = expanded('4 x 400 m @ 1:20 w/ 200 m jog');
    const rows = plan.filter((p) => p.kind === 'rep').map((p) => row(p.index, 'rep', 'missed', 0, 0));
    const [block] = repBlocks(plan, rows);
    expect(block!.run).toBe(0);
    expect(block!.average_s_per_km).toBeNull();
    expect(formatRepBlock(block!, 'km')).toBe('4 × 400 m: 0 of 4 on pace · none run');
  });
});
