import { useId } from 'react';
import { type KitReport, type KitSpec, formatVolts, supplyWindow } from '@/lib/electrical';

type Band = { from: number; to: number };

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
  return {
    supply,
    atDriverLow,
    string: { from: report.figures.stringVoltsMin, to: report.figures.stringVoltsMax } as Band,
    need: { from: report.figures.stringVoltsTyp + extra, to: needMax } as Band,
    extra,
    driverInput,
  };
}

function niceStep(span: number): number {
  const raw = span / 6;
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
  const top = Math.max(w.supply.high, w.need.to, w.driverInput?.to ?? 0) * 1.08;
  const step = niceStep(top);
  const axisMax = Math.ceil(top / step) * step;
  const x = (v: number) => LEFT + (Math.max(0, Math.min(v, axisMax)) / axisMax) * (W - LEFT - RIGHT);
  const rows = w.driverInput ? 3 : 2;
  const H = 20 + rows * ROW + 34;
  const ticks = Array.from({ length: Math.round(axisMax / step) + 1 }, (_, i) => i * step);
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
      </svg>
      <ul className="muted mt-2 grid gap-1 text-xs sm:grid-cols-2">
        <Legend swatch="bg-teal-600 dark:bg-teal-400" text={`supply ${formatVolts(w.supply.low)}–${formatVolts(w.supply.high)} (tolerance), nominal marked`} />
        {w.atDriverLow < w.supply.low ? <Legend swatch="bg-teal-200 dark:bg-teal-900" text={`lost in the wire: down to ${formatVolts(w.atDriverLow)}`} /> : null}
        <Legend swatch="bg-stone-400 dark:bg-stone-500" text={`string ${formatVolts(w.string.from)}–${formatVolts(w.string.to)}`} />
        <Legend
          swatch="bg-amber-500 dark:bg-amber-400"
          text={`needed at the driver: ${formatVolts(w.need.from)} (typical) to ${formatVolts(w.need.to)} (worst case)${w.extra > 0 ? `, incl. ${formatVolts(w.extra)} for the driver` : ''}`}
        />
        {w.driverInput ? <Legend swatch="bg-stone-300 dark:bg-stone-600" text={`driver input ${formatVolts(w.driverInput.from)}–${formatVolts(w.driverInput.to)}`} /> : null}
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
