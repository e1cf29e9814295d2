import { lazy, Suspense } from 'react';
import type { FuelSchedule, HourTotals } from '../../../../shared/fuel/schedule.ts';
import { formatAmount, formatHoursMinutes, statusText } from '../utils/fuel-format.ts';

const FuelHoursChart = lazy(() => import('./fuel-hours-chart.tsx'));

function range(t: { low: number; high: number | null }): string {
  return t.high === null ? `${formatAmount(t.low)}+` : `${formatAmount(t.low)}–${formatAmount(t.high)}`;
}

function hourLabel(h: HourTotals): string {
  return `${formatHoursMinutes(h.from_s)}–${formatHoursMinutes(h.to_s)}`;
}

type FuelHoursProps = { schedule: FuelSchedule; chart?: boolean };

/**
 * Per clock hour: carbohydrate, fluid and sodium planned against the hour's target (the last, partial hour's target
 * prorated), each with its status word and glyph; the whole run's totals last. A bar chart of carbohydrate follows,
 * with this table as its fallback.
 */
export function FuelHours({ schedule, chart = true }: FuelHoursProps) {
  const th = 'py-1.5 pr-3 font-semibold whitespace-nowrap last:pr-0';
  const cellBase = 'py-1 pr-3 whitespace-nowrap last:pr-0';
  const td = `${cellBase} text-right`;
  const tdLeft = `${cellBase} text-left`;
  const cell = (value: number, target: { low: number; high: number | null }, status: HourTotals['status']['fluid']) => (
    <>
      <td className={td}>{formatAmount(value)}</td>
      <td className={`${td} text-ink-muted print:text-black`}>{range(target)}</td>
      <td className={tdLeft}>{statusText(status)}</td>
    </>
  );
  const bars = schedule.hours.map((h) => ({
    label: hourLabel(h),
    carbohydrate: Math.round(h.carbohydrate_g),
    low: Math.round(h.targets.carbohydrate.low),
    high: h.targets.carbohydrate.high === null ? null : Math.round(h.targets.carbohydrate.high),
  }));
  const description = schedule.hours
    .map((h) => `${hourLabel(h)}: ${Math.round(h.carbohydrate_g)} g planned, target ${range(h.targets.carbohydrate)} g`)
    .join('; ');
  return (
    <div className="flex flex-col gap-3">
      <div className="-mx-4 overflow-x-auto px-4 sm:-mx-5 sm:px-5 print:mx-0 print:overflow-visible print:px-0">
        <table className="w-full min-w-2xl text-sm tabular-nums print:min-w-0">
          <caption className="sr-only">Hourly totals against the targets</caption>
          <thead className="border-b border-line-strong text-ink-muted print:text-black">
            <tr>
              <th scope="col" rowSpan={2} className={`${th} text-left align-bottom`}>
                hour
              </th>
              <th scope="colgroup" colSpan={3} className={`${th} text-center`}>
                carbohydrate g
              </th>
              <th scope="colgroup" colSpan={3} className={`${th} text-center`}>
                fluid ml
              </th>
              <th scope="colgroup" colSpan={3} className={`${th} text-center`}>
                sodium mg
              </th>
              <th scope="col" rowSpan={2} className={`${th} text-right align-bottom`}>
                caffeine mg
              </th>
            </tr>
            <tr>
              {['carbohydrate', 'fluid', 'sodium'].flatMap((k) => [
                <th key={`${k}-p`} scope="col" className={`${th} text-right`}>
                  planned
                </th>,
                <th key={`${k}-t`} scope="col" className={`${th} text-right`}>
                  target
                </th>,
                <th key={`${k}-s`} scope="col" className={`${th} text-left`}>
                  status
                </th>,
              ])}
            </tr>
          </thead>
          <tbody>
            {schedule.hours.map((h) => (
              <tr key={h.hour} className="border-b border-line">
                <th scope="row" className={`${tdLeft} font-semibold`}>
                  {hourLabel(h)}
                </th>
                {cell(h.carbohydrate_g, h.targets.carbohydrate, h.status.carbohydrate)}
                {cell(h.fluid_ml, h.targets.fluid, h.status.fluid)}
                {cell(h.sodium_mg, h.targets.sodium, h.status.sodium)}
                <td className={td}>{formatAmount(h.caffeine_mg, { dashZero: true })}</td>
              </tr>
            ))}
            <tr className="border-t-2 border-line-strong font-semibold">
              <th scope="row" className={tdLeft}>
                whole run
              </th>
              {cell(schedule.totals.carbohydrate_g, schedule.target_totals.carbohydrate, schedule.status.carbohydrate)}
              {cell(schedule.totals.fluid_ml, schedule.target_totals.fluid, schedule.status.fluid)}
              {cell(schedule.totals.sodium_mg, schedule.target_totals.sodium, schedule.status.sodium)}
              <td className={td}>{formatAmount(schedule.totals.caffeine_mg, { dashZero: true })}</td>
            </tr>
          </tbody>
        </table>
      </div>
      <p className="text-xs text-ink-muted">
        ✓ within the target range · ▽ under it · △ over it. A last hour shorter than 60 minutes has its target prorated.
        {schedule.totals.caffeine_mg_per_kg !== null && schedule.totals.caffeine_mg > 0 && (
          <> Caffeine over the run: {formatAmount(schedule.totals.caffeine_mg_per_kg, { digits: 2 })} mg per kg of body mass.</>
        )}
      </p>
      {chart && (
        <figure className="flex flex-col gap-1 print:hidden">
          <figcaption className="text-xs font-semibold tracking-wide text-ink-muted uppercase">
            Carbohydrate per hour, planned and target
          </figcaption>
          <div role="img" aria-label={`${description}. The same figures are in the table above.`}>
            <Suspense fallback={<p className="py-12 text-center text-ink-muted">Drawing the chart…</p>}>
              <FuelHoursChart bars={bars} />
            </Suspense>
          </div>
        </figure>
      )}
    </div>
  );
}
