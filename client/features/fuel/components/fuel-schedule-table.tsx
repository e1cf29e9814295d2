import type { ScheduledIntake } from '../../../../shared/fuel/schedule.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { formatAmount } from '../utils/fuel-format.ts';

type FuelScheduleTableProps = { intakes: readonly ScheduledIntake[]; unit: Unit; showTimeOfDay: boolean };

/** Every planned intake: where (mile and km), when (clock from the start, and time of day), what, and what it carries. */
export function FuelScheduleTable({ intakes, unit, showTimeOfDay }: FuelScheduleTableProps) {
  const other: Unit = unit === 'mi' ? 'km' : 'mi';
  const at = (x: ScheduledIntake, u: Unit) => (u === 'mi' ? x.distance_mi : x.distance_km).toFixed(2);
  const th = 'py-1.5 pr-3 font-semibold whitespace-nowrap last:pr-0';
  const td = 'py-1 pr-3 whitespace-nowrap last:pr-0';
  return (
    <div className="-mx-4 overflow-x-auto px-4 sm:-mx-5 sm:px-5 print:mx-0 print:overflow-visible print:px-0">
      <table className="w-full min-w-xl text-sm tabular-nums print:min-w-0">
        <caption className="sr-only">Fuel schedule: each intake by distance and clock</caption>
        <thead className="border-b border-line-strong text-ink-muted print:text-black">
          <tr>
            <th scope="col" className={`${th} text-right`}>
              at {unit}
            </th>
            <th scope="col" className={`${th} text-right`}>
              at {other}
            </th>
            <th scope="col" className={`${th} text-right`}>
              clock
            </th>
            {showTimeOfDay && (
              <th scope="col" className={`${th} text-right`}>
                time of day
              </th>
            )}
            <th scope="col" className={`${th} text-left`}>
              take
            </th>
            <th scope="col" className={`${th} text-right`}>
              carbs g
            </th>
            <th scope="col" className={`${th} text-right`}>
              fluid ml
            </th>
            <th scope="col" className={`${th} text-right`}>
              sodium mg
            </th>
            <th scope="col" className={`${th} text-right`}>
              caffeine mg
            </th>
            <th scope="col" className={`${th} text-left`}>
              refill
            </th>
          </tr>
        </thead>
        <tbody>
          {intakes.map((x, i) => (
            <tr key={`${x.time_s}-${x.rule_index}-${i}`} className="border-b border-line last:border-0">
              <td className={`${td} text-right`}>{at(x, unit)}</td>
              <td className={`${td} text-right text-ink-muted print:text-black`}>{at(x, other)}</td>
              <td className={`${td} text-right`}>{x.clock}</td>
              {showTimeOfDay && <td className={`${td} text-right`}>{x.time_of_day ?? ''}</td>}
              <th scope="row" className={`${td} text-left font-semibold`}>
                {x.label}
              </th>
              <td className={`${td} text-right`}>{formatAmount(x.carbohydrate_g, { digits: 1, dashZero: true })}</td>
              <td className={`${td} text-right`}>{formatAmount(x.fluid_ml, { dashZero: true })}</td>
              <td className={`${td} text-right`}>{formatAmount(x.sodium_mg, { dashZero: true })}</td>
              <td className={`${td} text-right`}>{formatAmount(x.caffeine_mg, { dashZero: true })}</td>
              <td className={td}>{x.refill ? 'refill first' : ''}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
