import { useId } from 'react';
import { type KitReport, type KitSpec, formatAmps, formatVolts, supplyWindow } from '@/lib/electrical';

type Band = { from: number; to: number };

/** The low-voltage (SELV) limit for ripple-free DC; the check's own limit when it reports one. */
const SELV_VOLTS = 60;

/** The numbers the plot draws, from the spec and its report. */
export function operatingWindow(spec: KitSpec, report: KitReport) {
  const supply = supplyWindow({ volts: spec.supply.volts, tolerancePct: spec.supply.tolerancePct ?? 5 });
  const headroom = report.checks.find((c) => c.id === 'headroom');
  const atDriverLow = headroom?.value ?? supply.low;
  const needMax = headroom?.limit ?? report.figures.stringVoltsMax;
  const extra = needMax - report.figures.stringVoltsMax;
  const d = spec.driver;
  const driverInput: Band | null =
    d.type === 'buck' ? { from: d.minInputVolts, to: d.maxInputVolts } : d.type === 'linear' ? { from: 0, to: d.maxInputVolts } : null;
  const selv = report.checks.find((c) => c.id === 'low-voltage-limit')?.limit ?? SELV_VOLTS;
  return {
    selv,
    supply,
    atDriverLow,
    string: { from: report.figures.stringVoltsMin, to: report.figures.stringVoltsMax } as Band,
    need: { from: report.figures.stringVoltsTyp + extra, to: needMax } as Band,
    extra,
    driverInput,
  };
}

function niceStep(span: number): number {
  const raw = Number.isFinite(span) && span > 0 ? span / 6 : 1;
  const p = Math.pow(10, Math.floor(Math.log10(raw)));
  return [1, 2, 5, 10].map((m) => m * p).find((s) => s >= raw) ?? 10 * p;
}

// A narrow drawing so its text stays readable when a phone scales it to 360 px.
const W = 360;
const LEFT = 82;
const RIGHT = 14;
const ROW = 34;

/**
 * The operating window on one voltage axis: where the supply can sit (tolerance, wire drop), what the
 * string needs (typical to worst case, with the driver's headroom), and what the driver accepts.
 */
export function WindowPlot({ spec, report }: { spec: KitSpec; report: KitReport }) {
  const id = useId();
  const w = operatingWindow(spec, report);
  // The axis takes in the 60 V limit once the build comes within reach of it (above 30 V), so the
  // limit is drawn where it is; below that it is marked at the edge, off scale.
  const reach = Math.max(w.supply.high, w.need.to, w.driverInput?.to ?? 0);
  const top = Math.max(reach, reach > w.selv / 2 ? w.selv : 0, 1) * 1.08;
  const step = niceStep(top);
  const axisMax = Math.ceil(top / step) * step;
  const selvOnScale = w.selv <= axisMax;
  const x = (v: number) => LEFT + (Math.max(0, Math.min(v, axisMax)) / axisMax) * (W - LEFT - RIGHT);
  const rows = w.driverInput ? 3 : 2;
  const H = 20 + rows * ROW + 34;
  const ticks = Array.from({ length: Math.min(30, Math.round(axisMax / step) + 1) }, (_, i) => Number((i * step).toPrecision(6)));
  const lowMargin = w.atDriverLow - w.need.to;
  const highMargin = w.driverInput ? w.driverInput.to - w.supply.high : null;
  const rowY = (i: number) => 20 + i * ROW;

  const summary =
    `Supply ${formatVolts(w.atDriverLow)} to ${formatVolts(w.supply.high)} at the driver; ` +
    `the string needs ${formatVolts(w.need.from)} on typical LEDs and ${formatVolts(w.need.to)} on worst-case ones` +
    (w.driverInput ? `; the driver accepts ${formatVolts(w.driverInput.from)} to ${formatVolts(w.driverInput.to)}.` : '.');

  return (
    <figure className="card">
      <figcaption className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
        <span className="font-bold">Operating window</span>
        <span className="muted text-sm">
          low-end margin <strong className="tabular-nums">{signedVolts(lowMargin)}</strong>
          {highMargin !== null ? (
            <>
              {' · '}high-end margin <strong className="tabular-nums">{signedVolts(highMargin)}</strong>
            </>
          ) : null}
        </span>
      </figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} className="mx-auto h-auto w-full max-w-lg" role="img" aria-labelledby={`${id}-title ${id}-desc`}>
        <title id={`${id}-title`}>Operating window on a voltage axis</title>
        <desc id={`${id}-desc`}>{summary}</desc>

        {/* grid and axis */}
        {ticks.map((t) => (
          <g key={t}>
            <line x1={x(t)} x2={x(t)} y1={12} y2={H - 28} className="stroke-stone-200 dark:stroke-stone-700" />
            <text x={x(t)} y={H - 12} textAnchor="middle" className="fill-stone-600 text-[11px] dark:fill-stone-400">
              {t} V
            </text>
          </g>
        ))}

        {/* row 1: the supply */}
        <RowLabel y={rowY(0)} text="Supply" />
        {w.atDriverLow < w.supply.low ? (
          <rect x={x(w.atDriverLow)} width={Math.max(1, x(w.supply.low) - x(w.atDriverLow))} y={rowY(0)} height={16} className="fill-teal-200 dark:fill-teal-900" />
        ) : null}
        <rect x={x(w.supply.low)} width={Math.max(2, x(w.supply.high) - x(w.supply.low))} y={rowY(0)} height={16} rx={3} className="fill-teal-600 dark:fill-teal-400" />
        <line x1={x(w.supply.nominal)} x2={x(w.supply.nominal)} y1={rowY(0) - 3} y2={rowY(0) + 19} className="stroke-stone-900 dark:stroke-white" strokeWidth={2} />

        {/* row 2: what the string needs */}
        <RowLabel y={rowY(1)} text="String needs" />
        <rect x={x(w.string.from)} width={Math.max(2, x(w.string.to) - x(w.string.from))} y={rowY(1) + 4} height={8} rx={2} className="fill-stone-400 dark:fill-stone-500" />
        <rect x={x(w.need.from)} width={Math.max(2, x(w.need.to) - x(w.need.from))} y={rowY(1)} height={16} rx={3} className="fill-amber-500 dark:fill-amber-400" />

        {/* row 3: what the driver accepts */}
        {w.driverInput ? (
          <>
            <RowLabel y={rowY(2)} text="Driver input" />
            <rect x={x(w.driverInput.from)} width={Math.max(2, x(w.driverInput.to) - x(w.driverInput.from))} y={rowY(2)} height={16} rx={3} className="fill-stone-300 dark:fill-stone-600" />
          </>
        ) : null}

        {/* the two lines that decide the verdict */}
        <line x1={x(w.need.to)} x2={x(w.need.to)} y1={12} y2={H - 28} strokeDasharray="4 3" className="stroke-amber-700 dark:stroke-amber-300" strokeWidth={1.5} />
        {w.driverInput ? (
          <line x1={x(w.driverInput.to)} x2={x(w.driverInput.to)} y1={12} y2={H - 28} strokeDasharray="4 3" className="stroke-red-700 dark:stroke-red-300" strokeWidth={1.5} />
        ) : null}

        {/* the low-voltage limit: on scale a solid line, otherwise an arrow at the right edge */}
        <g data-plot="selv">
          {selvOnScale ? (
            <>
              <line x1={x(w.selv)} x2={x(w.selv)} y1={6} y2={H - 28} className="stroke-purple-700 dark:stroke-purple-300" strokeWidth={2} />
              <text x={x(w.selv) - 3} y={10} textAnchor="end" className="fill-purple-800 text-[10px] font-semibold dark:fill-purple-200">
                {w.selv} V limit
              </text>
            </>
          ) : (
            <text x={W - 2} y={10} textAnchor="end" className="fill-purple-800 text-[10px] font-semibold dark:fill-purple-200">
              {w.selv} V limit →
            </text>
          )}
        </g>
      </svg>
      <CurrentStrip spec={spec} report={report} />
      <ul className="muted mt-2 grid gap-1 text-xs sm:grid-cols-2">
        <Legend swatch="bg-teal-600 dark:bg-teal-400" text={`supply ${formatVolts(w.supply.low)}–${formatVolts(w.supply.high)} (tolerance), nominal marked`} />
        {w.atDriverLow < w.supply.low ? <Legend swatch="bg-teal-200 dark:bg-teal-900" text={`lost in the wire: down to ${formatVolts(w.atDriverLow)}`} /> : null}
        <Legend swatch="bg-stone-400 dark:bg-stone-500" text={`string ${formatVolts(w.string.from)}–${formatVolts(w.string.to)}`} />
        <Legend
          swatch="bg-amber-500 dark:bg-amber-400"
          text={`needed at the driver: ${formatVolts(w.need.from)} (typical) to ${formatVolts(w.need.to)} (worst case)${w.extra > 0 ? `, incl. ${formatVolts(w.extra)} for the driver` : ''}`}
        />
        {w.driverInput ? <Legend swatch="bg-stone-300 dark:bg-stone-600" text={`driver input ${formatVolts(w.driverInput.from)}–${formatVolts(w.driverInput.to)}`} /> : null}
        <Legend
          swatch="bg-purple-700 dark:bg-purple-300"
          text={`${w.selv} V: the low-voltage limit for DC; above it the build is outside the bench's scope${selvOnScale ? '' : ' (off this scale)'}`}
        />
      </ul>
    </figure>
  );
}

function RowLabel({ y, text }: { y: number; text: string }) {
  return (
    <text x={4} y={y + 12} className="fill-stone-800 text-[12px] font-semibold dark:fill-stone-200">
      {text}
    </text>
  );
}

function Legend({ swatch, text }: { swatch: string; text: string }) {
  return (
    <li className="flex items-start gap-2">
      <span aria-hidden className={`mt-0.5 inline-block size-3 shrink-0 rounded-sm ${swatch}`} />
      {text}
    </li>
  );
}

function signedVolts(v: number): string {
  return `${v >= 0 ? '+' : '−'}${formatVolts(Math.abs(v))}`;
}

/**
 * The LED current on its own axis: the set current, the ripple on top of it up to the peak, and the
 * limits the peak must stay under (the LED's rating, the inductor's saturation current when given).
 */
function CurrentStrip({ spec, report }: { spec: KitSpec; report: KitReport }) {
  const id = useId();
  const d = spec.driver;
  const peak = report.figures.ledAmpsPeak;
  const set = d.type === 'resistor' ? peak : d.outputAmps;
  const ripple = report.figures.rippleAmps;
  const ledMax = spec.string.led.maxAmps;
  const sat = d.type === 'buck' ? d.inductorSatAmps : undefined;
  const top = Math.max(peak, ledMax, sat ?? 0, 1e-6) * 1.1;
  const x = (a: number) => LEFT + (Math.max(0, Math.min(a, top)) / top) * (W - LEFT - RIGHT);
  const H = 58;
  const summary =
    `LED current: set ${formatAmps(set)}` +
    (ripple !== undefined ? `, ripple ${formatAmps(ripple)} peak to peak, peak ${formatAmps(peak)}` : `, peak ${formatAmps(peak)}`) +
    `; the LED is rated ${formatAmps(ledMax)}` +
    (sat !== undefined ? `; the inductor saturates at ${formatAmps(sat)}.` : '.');
  return (
    <div className="mt-3" data-plot="current">
      <svg viewBox={`0 0 ${W} ${H}`} className="mx-auto h-auto w-full max-w-lg" role="img" aria-labelledby={`${id}-t ${id}-d`}>
        <title id={`${id}-t`}>LED current with ripple against its limits</title>
        <desc id={`${id}-d`}>{summary}</desc>
        <RowLabel y={12} text="LED current" />
        <rect x={x(0)} width={Math.max(2, x(set) - x(0))} y={12} height={16} rx={3} className="fill-sky-600 dark:fill-sky-400" />
        {peak > set ? (
          <rect x={x(set)} width={Math.max(2, x(peak) - x(set))} y={12} height={16} className="fill-sky-300 dark:fill-sky-800" data-plot="ripple-peak" />
        ) : null}
        <line x1={x(ledMax)} x2={x(ledMax)} y1={6} y2={34} strokeDasharray="4 3" className="stroke-red-700 dark:stroke-red-300" strokeWidth={1.5} />
        {sat !== undefined ? (
          <line x1={x(sat)} x2={x(sat)} y1={6} y2={34} strokeDasharray="1 2" className="stroke-stone-900 dark:stroke-white" strokeWidth={1.5} />
        ) : null}
        <text x={x(0)} y={50} className="fill-stone-600 text-[11px] dark:fill-stone-400">0</text>
        <text x={x(top)} y={50} textAnchor="end" className="fill-stone-600 text-[11px] dark:fill-stone-400">
          {formatAmps(top)}
        </text>
      </svg>
      <ul className="muted mt-1 grid gap-1 text-xs sm:grid-cols-2">
        <Legend swatch="bg-sky-600 dark:bg-sky-400" text={`set current ${formatAmps(set)}`} />
        {peak > set ? <Legend swatch="bg-sky-300 dark:bg-sky-800" text={`ripple peak ${formatAmps(peak)} (set + half of ${formatAmps(ripple ?? 2 * (peak - set))})`} /> : null}
        <Legend swatch="bg-red-700 dark:bg-red-300" text={`LED rating ${formatAmps(ledMax)}`} />
        {sat !== undefined ? <Legend swatch="bg-stone-900 dark:bg-white" text={`inductor saturation ${formatAmps(sat)}`} /> : null}
      </ul>
    </div>
  );
}
