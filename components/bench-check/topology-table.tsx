import { VerdictBadge } from '@/components/ui/verdict-badge';
import { type TopologyRow, formatPercent, formatWatts } from '@/lib/electrical';

const NAME = { buck: 'Buck driver', linear: 'Linear driver', resistor: 'Series resistor' } as const;

/** The same string on the same supply three ways: what each wastes and what it takes to build. */
export function TopologyTable({ rows }: { rows: TopologyRow[] }) {
  return (
    <section aria-labelledby="compare-heading" className="card">
      <h2 id="compare-heading" className="text-lg font-bold">
        Three ways to drive this string
      </h2>
      <p className="muted mb-3 text-sm">Same supply, same LED current, a generic driver of each kind.</p>
      {/* Scrolls sideways on a narrow phone; focusable, so a keyboard can scroll it too (WCAG 2.1.1). */}
      <div className="relative overflow-x-auto" tabIndex={0} role="region" aria-labelledby="compare-heading">
        <table className="table-dense">
          <thead>
            <tr>
              <th scope="col">Driver</th>
              <th scope="col">Verdict</th>
              <th scope="col" className="text-right">
                Efficiency
              </th>
              <th scope="col" className="text-right">
                Heat
              </th>
              <th scope="col" className="text-right">
                Parts
              </th>
            </tr>
          </thead>
          <tbody>
            {[...rows]
              .sort((a, b) => a.rank - b.rank)
              .map((r) => (
                <tr key={r.type} data-rank={r.rank}>
                  <th scope="row" className="font-semibold">
                    {r.rank === 1 ? (
                      <span className="mr-1 text-xs font-bold text-teal-800 uppercase dark:text-teal-300">
                        first choice
                      </span>
                    ) : null}
                    {NAME[r.type]}
                    <span className="block text-xs font-normal">{r.reason}</span>
                    <span className="muted block text-xs font-normal">{r.driverNote}</span>
                  </th>
                  <td>
                    <VerdictBadge verdict={r.verdict} />
                  </td>
                  <td className="text-right whitespace-nowrap tabular-nums">
                    {r.report ? formatPercent(r.efficiency) : '—'}
                  </td>
                  <td className="text-right whitespace-nowrap tabular-nums">
                    {r.report ? formatWatts(r.heatWatts) : '—'}
                  </td>
                  <td className="text-right whitespace-nowrap tabular-nums" title={r.partsNote}>
                    {r.parts}
                    <span className="sr-only"> ({r.partsNote})</span>
                  </td>
                </tr>
              ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
