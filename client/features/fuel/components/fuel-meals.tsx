import type { MealPlan } from '../../../../shared/fuel/meals.ts';
import { formatAmount } from '../utils/fuel-format.ts';

function grams(r: { low_g: number; high_g: number }): string {
  return `${formatAmount(r.low_g)}–${formatAmount(r.high_g)} g`;
}

function Evidence({ evidence }: { evidence: string }) {
  if (evidence !== 'from memory') return null;
  return (
    <span className="ml-1 rounded-sm border border-tartan px-1 text-xs font-semibold text-tartan print:border-black print:text-black">
      from memory: check before relying on it
    </span>
  );
}

/** Pre-run meal, after-run refuel and carbohydrate loading as grams for this body mass, each with its source. */
export function FuelMeals({ meals, bodyMassKg }: { meals: MealPlan; bodyMassKg: number }) {
  const { pre_run: pre, after_run: after, carbohydrate_loading: loading } = meals;
  const rows = [
    {
      name: 'Meal before the run',
      figure: `${pre.g_per_kg.low}–${pre.g_per_kg.high} g/kg, ${pre.hours_before.low}–${pre.hours_before.high} h before`,
      grams: `${grams(pre.grams)} of carbohydrate`,
      note: pre.note,
      source: pre.source,
      evidence: pre.evidence,
    },
    {
      name: 'Refuel after the run',
      figure: `${after.g_per_kg.low}–${after.g_per_kg.high} g/kg per hour for ${after.hours} h`,
      grams: `${grams(after.grams_per_hour)} per hour (${grams(after.grams_total)} in all)`,
      note: after.note,
      source: after.source,
      evidence: after.evidence,
    },
    {
      name: 'Carbohydrate loading',
      figure: `${loading.g_per_kg.low}–${loading.g_per_kg.high} g/kg per day for ${loading.days.low * 24}–${loading.days.high * 24} h`,
      grams: loading.applies
        ? `${grams(loading.grams_per_day)} per day (${grams(loading.grams_total)} in all)`
        : 'not needed for this run',
      note: loading.note,
      source: loading.source,
      evidence: loading.evidence,
    },
  ];
  return (
    <div className="flex flex-col gap-3 text-sm">
      <p className="text-ink-muted print:text-black">For a body mass of {formatAmount(bodyMassKg, { digits: 1 })} kg.</p>
      <dl className="flex flex-col gap-3">
        {rows.map((r) => (
          <div key={r.name} className="border-b border-line pb-2 last:border-0">
            <dt className="font-semibold">{r.name}</dt>
            <dd className="tabular-nums">
              <span className="font-semibold">{r.grams}</span> <span className="text-ink-muted">({r.figure})</span>
            </dd>
            <dd>{r.note}</dd>
            <dd className="text-xs text-ink-muted print:text-black">
              Source: {r.source}
              <Evidence evidence={r.evidence} />
            </dd>
          </div>
        ))}
      </dl>
    </div>
  );
}
