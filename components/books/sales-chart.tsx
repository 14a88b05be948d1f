'use client';
import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { MonthCategoryPoint } from '@/lib/reconcile/chart';
import { formatMoney, minorUnitExponent } from '@/lib/money';

// Our own palette, each at least 4.5:1 against white; the legend names every colour in text, and the
// books page shows the same figures as a table for anyone who cannot read the colours.
const COLOURS = [
  '#0f766e',
  '#b45309',
  '#1d4ed8',
  '#7c3aed',
  '#be123c',
  '#4d7c0f',
  '#57534e',
  '#0e7490',
  '#a16207',
  '#334155',
];

export function SalesChart({
  points,
  categories,
  currency,
}: {
  points: MonthCategoryPoint[];
  categories: string[];
  currency: string;
}) {
  const scale = 10 ** minorUnitExponent(currency);
  const data = points.map((p) => ({
    ...p,
    ...Object.fromEntries(categories.map((c) => [c, Number(p[c] ?? 0) / scale])),
  }));
  const label = (c: string) => c.replaceAll('_', ' ');
  return (
    <figure>
      <div className="h-72 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <BarChart data={data} margin={{ top: 8, right: 8, bottom: 8, left: 8 }}>
            <CartesianGrid strokeDasharray="3 3" />
            <XAxis dataKey="month" />
            <YAxis width={70} tickFormatter={(v: number) => formatMoney(Math.round(v * scale), currency)} />
            <Tooltip
              formatter={(v, name) => [
                formatMoney(Math.round(Number(v) * scale), currency),
                label(String(name)),
              ]}
            />
            <Legend
              formatter={(v) => (
                <span className="text-stone-800 dark:text-stone-200">{label(String(v))}</span>
              )}
            />
            {categories.map((c, i) => (
              <Bar key={c} dataKey={c} stackId="sales" fill={COLOURS[i % COLOURS.length]} />
            ))}
          </BarChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="muted text-sm">
        Sales before refunds, by month and part category, in {currency}.
      </figcaption>
    </figure>
  );
}
