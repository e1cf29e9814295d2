import type { EnergyDetail, HeartRateZonesDetail } from '../../../../shared/runs/types.ts';
import { formatDuration } from '../../../../shared/tracks/format.ts';

/** Bounds are fractional bpm (a share of the reserve); shown rounded, the upper one exclusive. */
function formatZoneRange(from: number, to: number | null): string {
  if (from === 0 && to !== null) return `< ${Math.round(to)}`;
  if (to === null) return `≥ ${Math.round(from)}`;
  return `${Math.round(from)}–${Math.round(to)}`;
}

/** Time in each heart-rate zone, with how the zones were set and the usual caution. */
export function HeartRateZones({ zones }: { zones: HeartRateZonesDetail }) {
  const total = zones.seconds.reduce((sum, s) => sum + s, 0);
  const basis =
    zones.method === 'heart-rate reserve'
      ? `heart-rate reserve (Karvonen): resting ${zones.resting_hr} bpm, maximum ${zones.max_hr} bpm, zones from 50 % to 90 % of the reserve`
      : `percent of maximum heart rate (${zones.max_hr} bpm), zones from 50 % to 90 %`;
  return (
    <div className="flex flex-col gap-3">
      <div className="relative">
        <table className="w-full text-sm tabular-nums">
          <caption className="sr-only">Moving time in each heart-rate zone</caption>
          <thead className="border-b border-line-strong text-ink-muted">
            <tr>
              <th scope="col" className="py-1.5 pr-3 text-left font-semibold">
                Zone
              </th>
              <th scope="col" className="py-1.5 pr-3 text-right font-semibold">
                bpm
              </th>
              <th scope="col" className="py-1.5 pr-3 text-right font-semibold">
                Time
              </th>
              <th scope="col" className="w-2/5 py-1.5 text-left font-semibold">
                <span className="sr-only">Share of moving time</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {zones.zones.map((zone) => {
              const seconds = zones.seconds[zone.zone] ?? 0;
              const share = total > 0 ? seconds / total : 0;
              return (
                <tr key={zone.zone} className="border-b border-line last:border-0">
                  <th scope="row" className="py-1 pr-3 text-left font-semibold">
                    {zone.zone === 0 ? 'below 1' : zone.zone}
                  </th>
                  <td className="py-1 pr-3 text-right">{formatZoneRange(zone.from_bpm, zone.to_bpm)}</td>
                  <td className="py-1 pr-3 text-right">{formatDuration(seconds)}</td>
                  <td className="py-1">
                    <span className="flex items-center gap-2">
                      <span className="h-2 rounded-sm bg-teal" style={{ width: `${Math.round(share * 100)}%` }} />
                      <span className="text-xs whitespace-nowrap text-ink-muted">{Math.round(share * 100)} %</span>
                    </span>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="text-sm text-ink-muted">
        Zones by {basis}, from your profile when the run was imported; moving time only. Five zones at these percentages are
        common practice, not a measurement of you: a coach or physician sets zones for an individual, ideally from a test.
      </p>
    </div>
  );
}

/** The ACSM estimate of energy, said to be an estimate. */
export function EnergyEstimate({ energy }: { energy: EnergyDetail }) {
  return (
    <div className="flex flex-col gap-1">
      <p className="tabular-nums">
        <span className="text-lg font-semibold">≈ {Math.round(energy.gross_kcal)} kcal</span>{' '}
        <span className="text-ink-muted">gross · ≈ {Math.round(energy.net_kcal)} kcal above resting</span>
      </p>
      <p className="text-sm text-ink-muted">
        An estimate from the ACSM running equation for level running (ACSM’s Guidelines for Exercise Testing and Prescription), at
        your average moving speed and a weight of {energy.weight_kg} kg, with 5 kcal per litre of oxygen. Hills, wind and
        individual economy are not in it; treat it as a rough figure.
      </p>
    </div>
  );
}
