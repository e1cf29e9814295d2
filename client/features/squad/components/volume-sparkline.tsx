import { lazy, Suspense } from 'react';
import { UNIT_METRES } from '../../../../shared/units.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';

const VolumeSparklineChart = lazy(() => import('./volume-sparkline-chart.tsx'));

const WIDTH = 96;
const HEIGHT = 26;

function round(metres: number, unit: Unit): string {
  return String(Math.round(metres / UNIT_METRES[unit]));
}

/** The words the sparkline stands for: "12 weeks: 30 → 42 km (most 45)". */
export function describeVolume(values: number[], unit: Unit): string {
  if (values.length === 0) return 'No weeks to show';
  const most = Math.max(...values);
  return `${values.length} weeks: ${round(values[0]!, unit)} → ${round(values.at(-1)!, unit)} ${unit} (most ${round(most, unit)})`;
}

/** A tiny line of weekly distance, oldest left, this week right (dot); read out as a sentence. */
export function VolumeSparkline({ values, unit }: { values: number[]; unit: Unit }) {
  const label = describeVolume(values, unit);
  return (
    <span
      role="img"
      aria-label={label}
      title={label}
      className="inline-block align-middle"
      style={{ width: WIDTH, height: HEIGHT }}
    >
      <Suspense fallback={null}>
        <VolumeSparklineChart values={values} width={WIDTH} height={HEIGHT} />
      </Suspense>
    </span>
  );
}
