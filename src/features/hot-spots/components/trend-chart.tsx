import { Bar, CartesianGrid, ComposedChart, Legend, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { MonthCount } from '../../../../shared/hot-spots/trend';
import { monthLabel } from '../../../../shared/hot-spots/trend';

/** Monthly findings and repeats of the selection (recharts; loaded with this screen's chart only). */
export default function TrendChart({ trend, height = 240 }: { trend: MonthCount[]; height?: number }) {
  const data = trend.map((m) => ({ ...m, name: monthLabel(m.month) }));
  return (
    <div style={{ width: '100%', height }} role="img" aria-label={`Findings per month: ${data.map((d) => `${d.name} ${d.findings}`).join(', ')}`}>
      <ResponsiveContainer width="100%" height="100%">
        <ComposedChart data={data} margin={{ top: 8, right: 8, bottom: 0, left: 0 }}>
          <CartesianGrid stroke="var(--color-rule)" strokeDasharray="3 3" vertical={false} />
          <XAxis dataKey="name" tick={{ fill: 'var(--color-graphite)', fontSize: 13 }} stroke="var(--color-graphite-2)" interval="preserveStartEnd" minTickGap={12} />
          <YAxis allowDecimals={false} tick={{ fill: 'var(--color-graphite)', fontSize: 13 }} stroke="var(--color-graphite-2)" width={48} />
          <Tooltip contentStyle={{ background: 'var(--color-paper)', border: '2px solid var(--color-graphite)', color: 'var(--color-graphite)' }} />
          <Legend wrapperStyle={{ color: 'var(--color-graphite)' }} />
          <Bar dataKey="findings" name="Findings" fill="var(--color-graphite-2)" isAnimationActive={false} />
          <Line dataKey="repeats" name="Repeats" stroke="var(--color-shop)" strokeWidth={3} dot={{ r: 3 }} isAnimationActive={false} />
        </ComposedChart>
      </ResponsiveContainer>
    </div>
  );
}
