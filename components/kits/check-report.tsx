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
  result: Pick<StoredReport, 'kind' | 'report' | 'chain' | 'missing' | 'problems' | 'build'>;
  verdict: 'ok' | 'caution' | 'fail' | null;
  headingLevel?: 2 | 3;
  /** Whose build it is when a steward checks it for someone else; the reader's own otherwise. */
  borrowerName?: string;
};

export function CheckReport({ result, verdict, headingLevel = 2, borrowerName }: Props) {
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
      {result.build ? <BuildNote build={result.build} kind={result.kind} borrowerName={borrowerName} /> : null}
      {result.kind === 'checked' && result.report ? (
        <Checked report={result.report} chain={result.chain} />
      ) : null}
      {result.kind === 'incomplete' ? (
        <div>
          <p>The electrical chain is not complete, so the check cannot run yet. Missing:</p>
          <ul className="ml-5 list-disc">
            {(result.missing ?? []).map((m) => (
              <li key={m}>{m}</li>
            ))}
          </ul>
          {result.build?.present.length ? (
            <p className="mt-2">
              When you borrow {(result.missing ?? []).length > 1 ? 'them' : 'it'}, or describe your own, the whole
              build is checked against: {result.build.present.join(', ')}.
            </p>
          ) : null}
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

/** Loose parts are checked as the borrower's whole build: say what else went into it. */
function BuildNote({
  build,
  kind,
  borrowerName,
}: {
  build: NonNullable<StoredReport['build']>;
  kind: StoredReport['kind'];
  borrowerName?: string;
}) {
  const others = build.chains.length > 1;
  if (!build.held.length && !build.own.length && !others) return null;
  return (
    <div className="rounded-lg border border-stone-300 p-3 text-sm dark:border-stone-700" data-build>
      <p className="font-semibold">Checked as {borrowerName ? `${borrowerName}’s` : 'your'} whole build</p>
      {build.held.length ? (
        <p>
          Already out with {borrowerName ?? 'you'}: {build.held.join(', ')}.
        </p>
      ) : null}
      {build.own.length ? (
        <p>
          {borrowerName ? `${borrowerName}’s` : 'Your'} own parts: {build.own.join(', ')}.
        </p>
      ) : null}
      {others && kind === 'checked' ? (
        <ul className="mt-1 space-y-1">
          {build.chains.map((c, i) => (
            <li key={i} className="flex flex-wrap items-center gap-2">
              {c.verdict !== 'unreadable' ? <VerdictBadge verdict={c.verdict} /> : null}
              <span className="break-words">
                {c.chain.supply} → {c.chain.driver} → {c.chain.ledCount} × {c.chain.led}
              </span>
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}

const celsius = (c: number) => `${c.toFixed(0)} °C`;
const cPerW = (r: number) => `${(Math.floor(r * 10) / 10).toFixed(1)} °C/W`;

function Heat({ report, chain }: { report: KitReport; chain?: StoredReport['chain'] }) {
  const f = report.figures;
  // Reports stored before the check modelled heat have no junction figure.
  if (f.ledJunctionC === undefined) return null;
  const hot = report.checks.some((c) => c.verdict !== 'ok' && /junction|heat|thermal|sink/i.test(c.id));
  return (
    <div data-heat>
      <p className="font-semibold">Heat</p>
      <p className="text-sm">
        LED junction about <strong>{celsius(f.ledJunctionC)}</strong>
        {f.sinkC !== undefined ? `, heat sink about ${celsius(f.sinkC)}` : ''}
        {chain?.heatSink ? ` (on ${chain.heatSink})` : ' (no heat sink in the chain)'}.
        {f.regulatorJunctionC !== undefined
          ? ` Linear driver junction about ${celsius(f.regulatorJunctionC)}.`
          : ''}
      </p>
      {f.sinkCPerWNeeded !== undefined ? (
        <p className="text-sm">
          Largest heat sink that keeps the LEDs 25 °C under their maximum:{' '}
          <strong>a sink of at most {cPerW(f.sinkCPerWNeeded)}</strong>
          {chain?.heatSink ? ' each, as many as now' : ' for each LED'}.
        </p>
      ) : hot ? (
        <p className="text-sm">
          No heat sink alone fixes it: use fewer watts per LED (a lower current) or LEDs rated hotter.
        </p>
      ) : null}
    </div>
  );
}

function Checked({ report, chain }: { report: KitReport; chain?: StoredReport['chain'] }) {
  const notOk = report.checks.filter((c) => c.verdict !== 'ok');
  const f = report.figures;
  return (
    <>
      {chain ? (
        <p className="text-sm break-words">
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
      <Heat report={report} chain={chain} />
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
