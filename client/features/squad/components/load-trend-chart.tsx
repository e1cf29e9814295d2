import { Bar, BarChart, CartesianGrid, Cell, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';

export type LoadTrendBar = { label: string; trimp: number; current: boolean };

const INK_MUTED = '#545b69';
const LINE = '#ddd7ca';
const AXIS = { stroke: LINE, tick: { fill: INK_MUTED, fontSize: 12 }, tickLine: false } as const;

/** Weekly TRIMP as bars, this week last and darker (lazy: Recharts is a large chunk). */
export default function LoadTrendChart({ bars }: { bars: LoadTrendBar[] }) {
  return (
    <ResponsiveContainer width="100%" height={150}>
      <BarChart data={bars} margin={{ top: 6, right: 4, bottom: 0, left: 0 }}>
        <CartesianGrid stroke={LINE} vertical={false} />
        <XAxis dataKey="label" {...AXIS} />
        <YAxis width={40} allowDecimals={false} {...AXIS} />
        <Tooltip
          formatter={(value) => [typeof value === 'number' ? Math.round(value) : '–', 'TRIMP']}
          contentStyle={{ borderColor: LINE, fontSize: 13 }}
          cursor={{ fill: 'var(--color-teal-wash)' }}
          isAnimationActive={false}
        />
        <Bar dataKey="trimp" isAnimationActive={false} radius={[2, 2, 0, 0]}>
          {bars.map((bar) => (
            <Cell
              key={bar.label}
              fill={bar.current ? 'var(--color-teal-deep)' : 'var(--color-teal)'}
              fillOpacity={bar.current ? 1 : 0.55}
            />
          ))}
        </Bar>
      </BarChart>
    </ResponsiveContainer>
  );
}
