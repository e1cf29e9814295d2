import { formatDistance } from '../../../../shared/runs/display.ts';
import { formatDuration } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import type { FuelPlan } from '../../../../shared/fuel/answers.ts';
import { formatAmount } from '../utils/fuel-format.ts';
import { FuelCautions } from './fuel-cautions.tsx';
import { FuelHours } from './fuel-hours.tsx';
import { FuelScheduleTable } from './fuel-schedule-table.tsx';

/** Servings of each item to lay out: the intakes taken by hand, and what goes into every fill of every bottle. */
function layOut(plan: FuelPlan): Array<{ name: string; serving: string; count: number }> {
  const counts = new Map<string, number>();
  const add = (id: string, n: number) => counts.set(id, (counts.get(id) ?? 0) + n);
  for (const x of plan.schedule.intakes) if (x.item_id && x.servings) add(x.item_id, x.servings);
  for (const b of plan.schedule.bottles) for (const c of b.contents) add(c.item_id, c.servings * (1 + b.refills));
  return [...counts.entries()].map(([id, count]) => {
    const item = plan.items.find((i) => i.id === id);
    return { name: item?.name ?? 'an item since deleted', serving: item?.serving ?? '', count };
  });
}

/** The sheet for the night before: what to lay out, what goes in which bottle, when to take what, and the cautions. */
export function FuelPrintSheet({ plan, unit }: { plan: FuelPlan; unit: Unit }) {
  const items = layOut(plan);
  const h2 = 'mt-5 mb-2 text-lg font-semibold break-after-avoid';
  return (
    <div className="text-sm">
      <p className="tabular-nums">
        Expected {formatDuration(plan.expected_duration_s)} over {formatDistance(plan.expected_distance_m, unit)} {unit}
        {plan.start_clock && `, start at ${plan.start_clock}`} · body mass {formatAmount(plan.body_mass_kg, { digits: 1 })} kg
      </p>

      <h2 className={h2}>Lay out</h2>
      {items.length === 0 ? (
        <p>Nothing to lay out: this plan has no fuel items.</p>
      ) : (
        <ul className="flex flex-col gap-1">
          {items.map((i) => (
            <li key={i.name} className="flex gap-2">
              <span aria-hidden="true">☐</span>
              <span>
                <strong className="tabular-nums">{formatAmount(i.count, { digits: 2 })} ×</strong> {i.name}
                {i.serving && ` (${i.serving})`}
              </span>
            </li>
          ))}
        </ul>
      )}

      <h2 className={h2}>Bottles</h2>
      {plan.schedule.bottles.length === 0 ? (
        <p>No bottles in this plan.</p>
      ) : (
        <ul className="flex flex-col gap-1">
          {plan.schedule.bottles.map((b) => (
            <li key={b.id} className="flex gap-2 tabular-nums">
              <span aria-hidden="true">☐</span>
              <span>
                <strong>Bottle {b.id}</strong>: {formatAmount(b.volume_ml)} ml ({formatAmount(b.volume_fl_oz, { digits: 1 })} US
                fl oz) of{' '}
                {b.contents.length === 0
                  ? 'plain water'
                  : `water with ${b.contents.map((c) => `${c.name} ×${c.servings}`).join(', ')}`}{' '}
                → {formatAmount(b.carbohydrate_pct, { digits: 1 })} % carbohydrate, {formatAmount(b.sodium_mg_per_l)} mg/L sodium
                {b.caffeine_mg > 0 && `, ${formatAmount(b.caffeine_mg)} mg caffeine per bottle`}.{' '}
                {b.refills > 0 ? `Fill it ${1 + b.refills} times in all (${b.refills} during the run).` : 'One fill.'}
              </span>
            </li>
          ))}
        </ul>
      )}

      <h2 className={h2}>When to take what</h2>
      {plan.schedule.intakes.length === 0 ? (
        <p>No intakes fall inside this run.</p>
      ) : (
        <FuelScheduleTable intakes={plan.schedule.intakes} unit={unit} showTimeOfDay={plan.start_clock !== null} />
      )}

      <h2 className={h2}>Per hour against the targets</h2>
      <FuelHours schedule={plan.schedule} chart={false} />

      <div className="mt-5 break-inside-avoid">
        <FuelCautions cautions={plan.cautions} />
      </div>
    </div>
  );
}
