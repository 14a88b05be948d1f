import { Info, ShieldAlert } from 'lucide-react';
import { VerdictBadge } from '@/components/ui/verdict-badge';
import {
  type Caution,
  type Check,
  type KitReport,
  CHECK_TITLE,
  checkMargin,
  formatAmps,
  formatPercent,
  formatVolts,
  formatWatts,
} from '@/lib/electrical';
import { formatValueAndLimit } from './units';

/** A card with its own heading, labelled for screen readers. */
function Panel({ id, title, icon, children }: { id: string; title: string; icon?: React.ReactNode; children: React.ReactNode }) {
  return (
    <section aria-labelledby={id} className="card">
      <h2 id={id} className="mb-3 flex items-center gap-2 text-lg font-bold">
        {icon}
        {title}
      </h2>
      {children}
    </section>
  );
}

const HEADLINE = {
  ok: 'This build works, with margin on every check.',
  caution: 'This build works on typical parts, but some checks are close: see the cautions below.',
  fail: 'This build will not work as specified: fix the failed checks before powering it.',
} as const;

export function VerdictSummary({ report }: { report: KitReport }) {
  const counts = { ok: 0, caution: 0, fail: 0 };
  for (const c of report.checks) counts[c.verdict]++;
  return (
    <section aria-labelledby="verdict-heading" className="card flex flex-col gap-3" aria-live="polite">
      <h2 id="verdict-heading" className="sr-only">
        Verdict
      </h2>
      <div className="flex flex-wrap items-center gap-3">
        <VerdictBadge verdict={report.verdict} large />
        <p className="font-semibold">{HEADLINE[report.verdict]}</p>
      </div>
      <p className="muted text-sm">
        {report.checks.length} checks: {counts.ok} ok, {counts.caution} caution, {counts.fail} fail.
      </p>
    </section>
  );
}

function signedPercent(m: number): string {
  if (!Number.isFinite(m)) return m > 0 ? 'ample' : '—';
  return `${m >= 0 ? '+' : '−'}${formatPercent(Math.abs(m))}`;
}

/** Failed checks first, then cautions, then the rest, each with its numbers and what to change. */
export function ChecksList({ checks }: { checks: Check[] }) {
  const order = { fail: 0, caution: 1, ok: 2 };
  const sorted = [...checks].sort((a, b) => order[a.verdict] - order[b.verdict]);
  return (
    <Panel id="checks-heading" title="Checks">
      <ul className="divide-y divide-stone-200 dark:divide-stone-800">
        {sorted.map((c) => {
          const [value, limit] = formatValueAndLimit(c.value, c.limit, c.unit);
          return (
          <li key={c.id} className="py-3 first:pt-0 last:pb-0" data-check={c.id} data-verdict={c.verdict}>
            <div className="flex flex-wrap items-center justify-between gap-2">
              <h3 className="font-semibold">{CHECK_TITLE[c.id]}</h3>
              <VerdictBadge verdict={c.verdict} />
            </div>
            <dl className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-sm tabular-nums">
              <div>
                <dt className="muted inline">value </dt>
                <dd className="inline font-semibold">{value}</dd>
              </div>
              <div>
                <dt className="muted inline">limit </dt>
                <dd className="inline font-semibold">{limit}</dd>
              </div>
              <div>
                <dt className="muted inline">margin </dt>
                <dd className="inline font-semibold">{signedPercent(checkMargin(c))}</dd>
              </div>
            </dl>
            <p className="mt-1 text-sm break-words">{c.message}</p>
          </li>
          );
        })}
      </ul>
    </Panel>
  );
}

export function FiguresList({ report }: { report: KitReport }) {
  const f = report.figures;
  const rows: [string, string][] = [
    ['String voltage (min / typ / max)', `${formatVolts(f.stringVoltsMin)} / ${formatVolts(f.stringVoltsTyp)} / ${formatVolts(f.stringVoltsMax)}`],
    ['LED current, peak (incl. ripple)', formatAmps(f.ledAmpsPeak)],
    ['LED current, average', formatAmps(f.ledAmpsAvg)],
    ['Power per LED (worst case)', formatWatts(f.ledWatts)],
    ['Power into the LEDs', formatWatts(f.outputWatts)],
    ['Power from the supply', formatWatts(f.inputWatts)],
    ['Supply current', formatAmps(f.supplyAmps)],
    ['Heat in the driver or resistor', formatWatts(f.lossWatts)],
    ['Efficiency', formatPercent(f.efficiency)],
  ];
  if (f.duty !== undefined) rows.push(['Duty cycle (worst case)', formatPercent(f.duty)]);
  if (f.rippleAmps !== undefined) rows.push(['Inductor ripple, peak to peak', formatAmps(f.rippleAmps)]);
  if (f.wireDropVolts !== undefined) rows.push(['Drop in the wire run', formatVolts(f.wireDropVolts)]);
  if (f.resistorAmpsMax !== undefined) rows.push(['Current at the worst corner', formatAmps(f.resistorAmpsMax)]);
  return (
    <Panel id="figures-heading" title="Figures">
      <dl className="grid grid-cols-1 gap-x-6 gap-y-1.5 text-sm sm:grid-cols-2">
        {rows.map(([k, v]) => (
          <div key={k} className="flex min-w-0 justify-between gap-3 border-b border-stone-100 pb-1 dark:border-stone-800">
            <dt className="muted">{k}</dt>
            <dd className="font-semibold tabular-nums">{v}</dd>
          </div>
        ))}
      </dl>
    </Panel>
  );
}

export function CautionsList({ cautions }: { cautions: Caution[] }) {
  return (
    <Panel id="cautions-heading" title="Before you power it" icon={<ShieldAlert aria-hidden className="size-5 text-amber-700 dark:text-amber-300" />}>
      <ul className="space-y-2 text-sm">
        {cautions.map((c) => (
          <li key={c.id} className="flex gap-2">
            <Info aria-hidden className="mt-0.5 size-4 shrink-0 text-stone-500" />
            <span className={c.id === 'failed' ? 'font-semibold' : undefined}>{c.text}</span>
          </li>
        ))}
      </ul>
    </Panel>
  );
}
