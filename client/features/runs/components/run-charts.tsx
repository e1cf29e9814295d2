import type { ReactNode } from 'react';
import { Area, AreaChart, CartesianGrid, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { niceTicks, robustRange, type ChartRow } from '../../../../shared/runs/chart-series.ts';
import { formatPace } from '../../../../shared/tracks/format.ts';
import { CLIMB_UNIT, METRES_PER_FOOT } from '../../../../shared/units.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';

type RunChartsProps = { rows: ChartRow[]; unit: Unit };

const INK_MUTED = '#545b69';
const LINE = '#ddd7ca';
const AXIS = { stroke: LINE, tick: { fill: INK_MUTED, fontSize: 12 }, tickLine: false } as const;
const SYNC_ID = 'run-over-distance';
const HEIGHT = 150;
const PACE_STEPS_S = [5, 10, 15, 30, 60, 120, 300, 600];
const HR_STEPS = [5, 10, 20, 25, 50];
/** Tick steps in the climb unit (metres or feet: a 1 000 m range is about 3 300 ft). */
const ELEVATION_STEPS = [1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 2500, 5000];

/** Round ticks over the bulk of the values (spikes are clipped, not allowed to flatten the line). */
function scale(values: Array<number | null>, steps: number[]) {
  const range = robustRange(values);
  return range ? niceTicks(range[0], range[1], steps, 5) : undefined;
}
const Y_WIDTH = 48;

/**
 * Pace, heart rate and elevation over one shared distance axis (same domain, synchronised cursor).
 * Loaded lazily: Recharts is a large chunk and the split table does not need it.
 */
export default function RunCharts({ rows, unit }: RunChartsProps) {
  const maxDistance = rows.at(-1)?.distance ?? 0;
  const xAxis = (showTicks: boolean) => (
    <XAxis
      dataKey="distance"
      type="number"
      domain={[0, maxDistance]}
      tickFormatter={(v: number) => v.toFixed(maxDistance < 3 ? 1 : 0)}
      {...AXIS}
      hide={!showTicks}
      unit={showTicks ? ` ${unit}` : undefined}
    />
  );
  const tooltip = (label: string, format: (v: number) => string) => (
    <Tooltip
      formatter={(value) => [typeof value === 'number' ? format(value) : '–', label]}
      labelFormatter={(d) => `${Number(d).toFixed(2)} ${unit}`}
      contentStyle={{ borderColor: LINE, fontSize: 13 }}
      isAnimationActive={false}
    />
  );
  const pace = scale(
    rows.map((r) => r.pace_s),
    PACE_STEPS_S,
  );
  const hr = scale(
    rows.map((r) => r.hr),
    HR_STEPS,
  );
  // Elevation is drawn in the climb unit that goes with the distance unit (feet with miles).
  const climbUnit = CLIMB_UNIT[unit];
  const eleShown = rows.map((r) => (r.ele === null ? null : unit === 'mi' ? r.ele / METRES_PER_FOOT : r.ele));
  // Elevation keeps its full range: a hill is not a spike.
  const eleRange = robustRange(eleShown, 0, 1);
  const ele = eleRange ? niceTicks(eleRange[0], eleRange[1], ELEVATION_STEPS, 4) : undefined;
  const eleRows = rows.map((r, i) => ({ ...r, ele: eleShown[i] }));
  const hasHr = hr !== undefined;
  const hasEle = ele !== undefined;

  return (
    <div className="flex flex-col gap-1">
      <ChartTitle>Pace (per {unit}, faster up)</ChartTitle>
      <ResponsiveContainer width="100%" height={HEIGHT}>
        <LineChart data={rows} syncId={SYNC_ID} margin={{ top: 4, right: 8, bottom: 0, left: 0 }}>
          <CartesianGrid stroke={LINE} vertical={false} />
          {xAxis(!hasHr && !hasEle)}
          <YAxis
            dataKey="pace_s"
            reversed
            domain={pace?.domain}
            ticks={pace?.ticks}
            allowDataOverflow
            tickFormatter={(v: number) => formatPace(v)}
            width={Y_WIDTH}
            {...AXIS}
          />
          {tooltip('Pace', (v) => `${formatPace(v)} /${unit}`)}
          <Line dataKey="pace_s" stroke="var(--color-teal)" strokeWidth={1.5} dot={false} isAnimationActive={false} />
        </LineChart>
      </ResponsiveContainer>
      {hasHr && (
        <>
          <ChartTitle>Heart rate (bpm)</ChartTitle>
          <ResponsiveContainer width="100%" height={HEIGHT}>
            <LineChart data={rows} syncId={SYNC_ID} margin={{ top: 4, right: 8, bottom: 0, left: 0 }}>
              <CartesianGrid stroke={LINE} vertical={false} />
              {xAxis(!hasEle)}
              <YAxis dataKey="hr" domain={hr?.domain} ticks={hr?.ticks} allowDataOverflow width={Y_WIDTH} {...AXIS} />
              {tooltip('Heart rate', (v) => `${Math.round(v)} bpm`)}
              <Line dataKey="hr" stroke="var(--color-tartan)" strokeWidth={1.5} dot={false} isAnimationActive={false} />
            </LineChart>
          </ResponsiveContainer>
        </>
      )}
      {hasEle && (
        <>
          <ChartTitle>Elevation ({climbUnit})</ChartTitle>
          <ResponsiveContainer width="100%" height={HEIGHT + 20}>
            <AreaChart data={eleRows} syncId={SYNC_ID} margin={{ top: 4, right: 8, bottom: 0, left: 0 }}>
              <CartesianGrid stroke={LINE} vertical={false} />
              {xAxis(true)}
              <YAxis
                dataKey="ele"
                domain={ele?.domain}
                ticks={ele?.ticks}
                tickFormatter={(v: number) => Math.round(v).toString()}
                width={Y_WIDTH}
                {...AXIS}
              />
              {tooltip('Elevation', (v) => `${Math.round(v)} ${climbUnit}`)}
              <Area
                dataKey="ele"
                stroke="var(--color-ink-muted)"
                fill="var(--color-line)"
                strokeWidth={1}
                isAnimationActive={false}
              />
            </AreaChart>
          </ResponsiveContainer>
        </>
      )}
    </div>
  );
}

function ChartTitle({ children }: { children: ReactNode }) {
  return <p className="mt-2 text-xs font-semibold tracking-wide text-ink-muted uppercase first:mt-0">{children}</p>;
}
