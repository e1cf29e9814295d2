import { Line, LineChart, YAxis } from 'recharts';

type VolumeSparklineChartProps = { values: number[]; width: number; height: number };

/** Twelve weekly distances as a tiny line (lazy: Recharts is a large chunk). No axes: the label says the figures. */
export default function VolumeSparklineChart({ values, width, height }: VolumeSparklineChartProps) {
  const data = values.map((value, week) => ({ week, value }));
  const last = data.length - 1;
  return (
    <LineChart width={width} height={height} data={data} margin={{ top: 3, right: 3, bottom: 3, left: 3 }}>
      <YAxis hide domain={[0, 'dataMax']} />
      <Line
        dataKey="value"
        stroke="var(--color-teal)"
        strokeWidth={1.5}
        isAnimationActive={false}
        dot={(props: { cx?: number; cy?: number; index?: number }) =>
          props.index === last ? (
            <circle key="last" cx={props.cx} cy={props.cy} r={2.5} fill="var(--color-teal)" />
          ) : (
            <g key={props.index} />
          )
        }
      />
    </LineChart>
  );
}
