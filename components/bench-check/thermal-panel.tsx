import { Thermometer } from 'lucide-react';
import { VerdictBadge } from '@/components/ui/verdict-badge';
import { type KitReport, type KitSpec, DEFAULT_AMBIENT_C, DEFAULT_MAX_JUNCTION_C, JUNCTION_CAUTION_MARGIN_C } from '@/lib/electrical';
import { formatCelsius, sinkAtMost } from './units';

/**
 * Heat, as an engineer reads it: each junction against its maximum, the sink's temperature, and the
 * largest sink thermal resistance that would still pass — the number to take to the shelf.
 */
export function ThermalPanel({ spec, report }: { spec: KitSpec; report: KitReport }) {
  const f = report.figures;
  const led = report.checks.find((c) => c.id === 'led-junction');
  const reg = report.checks.find((c) => c.id === 'regulator-junction');
  const ambient = spec.ambientC ?? DEFAULT_AMBIENT_C;
  const ledMax = spec.string.led.maxJunctionC ?? DEFAULT_MAX_JUNCTION_C;
  const sinks = spec.heatSink;
  const needed = f.sinkCPerWNeeded;
  const ledTrouble = led && led.verdict !== 'ok';

  return (
    <section aria-labelledby="thermal-heading" className="card" data-panel="thermal">
      <h2 id="thermal-heading" className="mb-1 flex items-center gap-2 text-lg font-bold">
        <Thermometer aria-hidden className="size-5 text-stone-600 dark:text-stone-300" />
        Heat
      </h2>
      <p className="muted mb-3 text-sm">
        Worst case, all electrical power counted as heat, in a {formatCelsius(ambient)} room. A junction within {JUNCTION_CAUTION_MARGIN_C} °C
        of its maximum is a caution.
      </p>

      {ledTrouble ? (
        <p role="note" data-thermal-advice className="mb-3 rounded-lg border-2 border-amber-700 bg-amber-50 p-3 text-sm font-semibold text-amber-950 dark:border-amber-400 dark:bg-amber-950 dark:text-amber-100">
          {needed !== undefined
            ? `Needs a heat sink of at most ${sinkAtMost(needed)} ${sinks ? (sinks.count === 1 ? 'for the LEDs' : `for each of the ${sinks.count} sinks`) : 'under each LED'}${sinks ? ` (the kit's is ${sinkAtMost(sinks.cPerW)})` : ''}.`
            : 'No heat sink is enough at this power: lower the current or use LEDs rated for it.'}
        </p>
      ) : null}

      <dl className="grid grid-cols-1 gap-x-6 gap-y-2 text-sm sm:grid-cols-2">
        <Row label="LED junction" value={formatCelsius(f.ledJunctionC)} detail={`max ${formatCelsius(ledMax)}`} verdict={led?.verdict} />
        {f.sinkC !== undefined ? <Row label={sinks && sinks.count > 1 ? 'Each heat sink' : 'Heat sink'} value={formatCelsius(f.sinkC)} detail={sinks ? `${sinkAtMost(sinks.cPerW)} each` : undefined} /> : null}
        <Row
          label={sinks ? 'Largest sink that passes' : 'Sink per LED that would pass'}
          value={needed !== undefined ? sinkAtMost(needed) : 'none is enough'}
          detail={`keeps the junction at or under ${formatCelsius(ledMax - JUNCTION_CAUTION_MARGIN_C)}`}
        />
        {f.regulatorJunctionC !== undefined ? (
          <Row
            label="Linear driver junction"
            value={formatCelsius(f.regulatorJunctionC)}
            detail={reg ? `max ${formatCelsius(reg.limit)}` : undefined}
            verdict={reg?.verdict}
          />
        ) : null}
      </dl>
    </section>
  );
}

function Row({ label, value, detail, verdict }: { label: string; value: string; detail?: string; verdict?: 'ok' | 'caution' | 'fail' }) {
  return (
    <div className="flex min-w-0 flex-wrap items-center justify-between gap-x-3 gap-y-1 border-b border-stone-100 pb-1.5 dark:border-stone-800">
      <dt className="muted">{label}</dt>
      <dd className="flex flex-wrap items-center gap-2">
        <span className="font-semibold tabular-nums">{value}</span>
        {detail ? <span className="muted text-xs">{detail}</span> : null}
        {verdict ? <VerdictBadge verdict={verdict} /> : null}
      </dd>
    </div>
  );
}
