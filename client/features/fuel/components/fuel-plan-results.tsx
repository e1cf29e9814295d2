import { cautionsFor } from '../../../../shared/fuel/cautions.ts';
import { formatDistance } from '../../../../shared/runs/display.ts';
import { formatDuration } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { Card } from '../../../components/ui/card.tsx';
import { EmptyState } from '../../../components/ui/empty-state.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import type { FuelPlan } from '../../../../shared/fuel/answers.ts';
import { formatAmount } from '../utils/fuel-format.ts';
import { FuelCautions } from './fuel-cautions.tsx';
import { FuelHours } from './fuel-hours.tsx';
import { FuelMeals } from './fuel-meals.tsx';
import { FuelScheduleTable } from './fuel-schedule-table.tsx';

/** The cautions shown before anything is computed: the numbers on this page are about these three. */
const BEFORE_SAVE_CAUTIONS = cautionsFor(['carbohydrate', 'fluid', 'sodium']);

function targetWords(t: FuelPlan['targets']['carbohydrate']): string {
  return `${formatAmount(t.low)}–${t.high === null ? '…' : formatAmount(t.high)} ${t.unit}`;
}

/** The summary line, the schedule, the hourly totals (table and chart), the cautions and the meal figures. */
export function FuelPlanResults({ plan, unit }: { plan: FuelPlan | null; unit: Unit }) {
  if (!plan) {
    return (
      <div className="flex flex-col gap-4">
        <EmptyState title="No schedule yet">
          <p>Fill in the inputs and save: Pacewright places each intake by distance and clock and totals every hour.</p>
        </EmptyState>
        <FuelCautions cautions={BEFORE_SAVE_CAUTIONS} />
      </div>
    );
  }
  const { schedule, targets } = plan;
  return (
    <div className="flex flex-col gap-4">
      <p className="flex flex-wrap gap-x-3 gap-y-1 rounded-md border border-line bg-card px-3 py-2 text-sm tabular-nums">
        <span>
          expected <strong>{formatDuration(plan.expected_duration_s)}</strong> over{' '}
          <strong>{formatDistance(plan.expected_distance_m, unit)}</strong> {unit}
        </span>
        <span>· carbs {targetWords(targets.carbohydrate)}</span>
        <span>· fluid {targetWords(targets.fluid)}</span>
        <span>· sodium {targetWords(targets.sodium)}</span>
      </p>
      {plan.source_changed && (
        <FormAlert>The session or goal race changed after this plan was computed: save again to refresh the schedule.</FormAlert>
      )}
      {schedule.warnings.map((w) => (
        <FormAlert key={w}>{w}</FormAlert>
      ))}
      <Card title="Schedule" description={`Each intake by ${unit === 'mi' ? 'mile' : 'kilometre'} and clock from the start.`}>
        {schedule.intakes.length > 0 ? (
          <FuelScheduleTable intakes={schedule.intakes} unit={unit} showTimeOfDay={plan.start_clock !== null} />
        ) : (
          <p className="text-sm text-ink-muted">No intakes fall inside this run. Add an intake above.</p>
        )}
        {schedule.bottles.length > 0 && (
          <ul className="mt-3 flex flex-col gap-1 text-sm tabular-nums">
            {schedule.bottles.map((b) => (
              <li key={b.id}>
                <strong>Bottle {b.id}</strong>: {formatAmount(b.volume_ml)} ml ({formatAmount(b.volume_fl_oz, { digits: 1 })} US
                fl oz), {b.contents.length === 0 ? 'water' : b.contents.map((c) => `${c.name} ×${c.servings}`).join(', ')} ·{' '}
                {formatAmount(b.carbohydrate_pct, { digits: 1 })} % carbohydrate · {formatAmount(b.sodium_mg_per_l)} mg/L sodium
                {b.refills > 0 && ` · refilled ${b.refills} ${b.refills === 1 ? 'time' : 'times'}`}
              </li>
            ))}
          </ul>
        )}
      </Card>
      <Card title="Hourly totals against the targets">
        <FuelHours schedule={schedule} />
        <div className="mt-3 text-xs text-ink-muted">
          <p className="font-semibold">Where the targets come from</p>
          <ul className="mt-1 flex flex-col gap-1">
            {(['carbohydrate', 'fluid', 'sodium'] as const).map((k) => (
              <li key={k}>
                {k} {targetWords(targets[k])}: {targets[k].source}
                {targets[k].evidence === 'from memory' && ' (from memory: check before relying on it)'}. {targets[k].note}
              </li>
            ))}
          </ul>
        </div>
      </Card>
      <FuelCautions cautions={plan.cautions} />
      <Card title="Meals around the run" description="Carbohydrate before, after, and in the days before a long race.">
        <FuelMeals meals={plan.meals} bodyMassKg={plan.body_mass_kg} />
      </Card>
    </div>
  );
}
