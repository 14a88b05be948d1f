import { CHECK_TITLE, type Check, type KitReport } from '@/lib/electrical';
import { amps, percent, volts, watts } from '@/lib/format';
import type { StoredReport } from '@/lib/loans/check';
import { VerdictBadge } from '@/components/ui/verdict-badge';

// The compatibility check as the member sees it: the verdict in a word and an icon, what the chain is,
// each check with its value and limit, what to change, and the figures.

export function formatValue(unit: string, v: number): string {
  switch (unit) {
    case 'V':
      return volts(v);
    case 'A':
      return amps(v);
    case 'W':
      return watts(v);
    case 'ratio':
      return percent(v);
    default:
      return `${Number.isFinite(v) ? v.toPrecision(3) : '—'} ${unit}`;
  }
}

type Props = {
  result: Pick<StoredReport, 'kind' | 'report' | 'chain' | 'missing' | 'problems'>;
  verdict: 'ok' | 'caution' | 'fail' | null;
  headingLevel?: 2 | 3;
};

export function CheckReport({ result, verdict, headingLevel = 2 }: Props) {
  const H = `h${headingLevel}` as 'h2' | 'h3';
  return (
    <section aria-labelledby="check-heading" className="card space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <H id="check-heading" className="text-lg font-bold">
          Compatibility check
        </H>
        {verdict ? (
          <VerdictBadge verdict={verdict} large />
        ) : (
          <span className="muted text-sm">Not checked</span>
        )}
      </div>
      {result.kind === 'checked' && result.report ? (
        <Checked report={result.report} chain={result.chain} />
      ) : null}
      {result.kind === 'incomplete' ? (
        <div>
          <p>The electrical chain is not complete, so the check cannot run. Missing:</p>
          <ul className="ml-5 list-disc">
            {(result.missing ?? []).map((m) => (
              <li key={m}>{m}</li>
            ))}
          </ul>
        </div>
      ) : null}
      {result.kind === 'unreadable' ? (
        <div>
          <p>The stored specs of a part cannot feed the check; a steward should fix the part first:</p>
          <ul className="ml-5 list-disc">
            {(result.problems ?? []).map((m) => (
              <li key={m}>{m}</li>
            ))}
          </ul>
        </div>
      ) : null}
      {result.kind === 'none' ? (
        <p className="muted">
          Nothing here forms a supply → driver → LED chain, so there is nothing electrical to check.
        </p>
      ) : null}
    </section>
  );
}

function Checked({ report, chain }: { report: KitReport; chain?: StoredReport['chain'] }) {
  const notOk = report.checks.filter((c) => c.verdict !== 'ok');
  const f = report.figures;
  return (
    <>
      {chain ? (
        <p className="text-sm">
          {chain.supply} → {chain.driver} → {chain.ledCount} × {chain.led}
        </p>
      ) : null}
      {notOk.length ? (
        <div>
          <p className="font-semibold">What to change</p>
          <ul className="mt-1 space-y-2">
            {notOk.map((c) => (
              <li key={c.id} className="flex gap-2">
                <span className="shrink-0">
                  <VerdictBadge verdict={c.verdict} />
                </span>
                <span>{c.message}</span>
              </li>
            ))}
          </ul>
        </div>
      ) : (
        <p>Every check passes with these exact parts.</p>
      )}
      <details>
        <summary className="cursor-pointer font-semibold">All checks and figures</summary>
        <ul className="mt-2 divide-y divide-stone-200 dark:divide-stone-800">
          {report.checks.map((c) => (
            <CheckRow key={c.id} check={c} />
          ))}
        </ul>
        <dl className="mt-3 grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-3">
          <Figure term="String voltage" value={`${volts(f.stringVoltsMin)} – ${volts(f.stringVoltsMax)}`} />
          <Figure term="LED current (peak)" value={amps(f.ledAmpsPeak)} />
          <Figure term="Power per LED" value={watts(f.ledWatts)} />
          <Figure term="Output power" value={watts(f.outputWatts)} />
          <Figure term="Supply current" value={amps(f.supplyAmps)} />
          <Figure term="Heat in the driver" value={watts(f.lossWatts)} />
          <Figure term="Efficiency" value={percent(f.efficiency)} />
          {f.duty !== undefined ? <Figure term="Duty (worst case)" value={percent(f.duty)} /> : null}
          {f.wireDropVolts !== undefined ? <Figure term="Wire drop" value={volts(f.wireDropVolts)} /> : null}
        </dl>
      </details>
    </>
  );
}

function CheckRow({ check }: { check: Check }) {
  return (
    <li className="py-2">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className="font-semibold">{CHECK_TITLE[check.id] ?? check.id}</span>
        <VerdictBadge verdict={check.verdict} />
      </div>
      <p className="muted text-sm">
        {formatValue(check.unit, check.value)} against a limit of {formatValue(check.unit, check.limit)}
      </p>
      <p className="text-sm">{check.message}</p>
    </li>
  );
}

function Figure({ term, value }: { term: string; value: string }) {
  return (
    <div>
      <dt className="muted">{term}</dt>
      <dd className="font-semibold">{value}</dd>
    </div>
  );
}
