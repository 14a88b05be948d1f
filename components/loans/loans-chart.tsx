'use client';
import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { WeekPoint } from '@/lib/loans/queries';

// Loans out and overdue at the end of each of the last twelve weeks. The drawing is hidden from
// assistive technology (and not focusable); the table under it carries the same numbers.
export function LoansChart({ points }: { points: WeekPoint[] }) {
  return (
    <figure className="space-y-2">
      <div className="h-64 w-full" aria-hidden>
        <ResponsiveContainer width="100%" height="100%">
          <BarChart
            data={points}
            margin={{ top: 8, right: 8, bottom: 0, left: -16 }}
            accessibilityLayer={false}
          >
            <CartesianGrid strokeDasharray="3 3" stroke="#d6d3d1" />
            <XAxis dataKey="week" tick={{ fontSize: 12 }} />
            <YAxis allowDecimals={false} tick={{ fontSize: 12 }} />
            <Tooltip />
            <Legend />
            <Bar dataKey="out" name="Out" fill="#0f766e" />
            <Bar dataKey="overdue" name="Overdue" fill="#b91c1c" />
          </BarChart>
        </ResponsiveContainer>
      </div>
      <figcaption>
        <details>
          <summary className="cursor-pointer text-sm">The numbers</summary>
          <table className="table-dense mt-1">
            <thead>
              <tr>
                <th scope="col">Week ending</th>
                <th scope="col">Out</th>
                <th scope="col">Overdue</th>
              </tr>
            </thead>
            <tbody>
              {points.map((p) => (
                <tr key={p.week}>
                  <td>{p.week}</td>
                  <td>{p.out}</td>
                  <td>{p.overdue}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </details>
      </figcaption>
    </figure>
  );
}
