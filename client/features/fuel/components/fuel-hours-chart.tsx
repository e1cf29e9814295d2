import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';

export type FuelHourBar = { label: string; carbohydrate: number; low: number; high: number | null };

const INK_MUTED = '#545b69';
const LINE = '#ddd7ca';
const AXIS = { stroke: LINE, tick: { fill: INK_MUTED, fontSize: 12 }, tickLine: false } as const;

/** Carbohydrate per clock hour beside the low and high ends of the target (lazy: Recharts is a large chunk). */
export default function FuelHoursChart({ bars }: { bars: FuelHourBar[] }) {
  return (
    <ResponsiveContainer width="100%" height={170}>
      <BarChart data={bars} margin={{ top: 6, right: 4, bottom: 0, left: 0 }}>
        <CartesianGrid stroke={LINE} vertical={false} />
        <XAxis dataKey="label" {...AXIS} />
        <YAxis width={40} allowDecimals={false} {...AXIS} unit=" g" />
        <Tooltip
          formatter={(value, name) => [typeof value === 'number' ? `${Math.round(value)} g` : '–', String(name)]}
          contentStyle={{ borderColor: LINE, fontSize: 13 }}
          cursor={{ fill: 'var(--color-teal-wash)' }}
          isAnimationActive={false}
        />
        <Legend wrapperStyle={{ fontSize: 12 }} />
        <Bar dataKey="carbohydrate" name="planned" fill="var(--color-teal)" isAnimationActive={false} radius={[2, 2, 0, 0]} />
        <Bar dataKey="low" name="target, low end" fill="#8a8578" fillOpacity={0.45} isAnimationActive={false} />
        <Bar dataKey="high" name="target, high end" fill="#8a8578" fillOpacity={0.25} isAnimationActive={false} />
      </BarChart>
    </ResponsiveContainer>
  );
}
