// Display precision for the product: volts to 0.1 V, currents to the milliamp, watts to 0.01 W.

const DASH = '—';
const noNegativeZero = (s: string) => (/^-0(\.0+)?$/.test(s) ? s.slice(1) : s);

export function formatVolts(v: number): string {
  return Number.isFinite(v) ? `${noNegativeZero(v.toFixed(1))} V` : DASH;
}

export function formatAmps(a: number): string {
  if (!Number.isFinite(a)) return DASH;
  if (Math.abs(a) < 1) return `${noNegativeZero(Math.round(a * 1000).toFixed(0))} mA`;
  return `${a.toFixed(3)} A`;
}

export function formatWatts(w: number): string {
  return Number.isFinite(w) ? `${noNegativeZero(w.toFixed(2))} W` : DASH;
}

/** A fraction (0.877) as a percentage ("87.7 %"). */
export function formatPercent(fraction: number): string {
  return Number.isFinite(fraction) ? `${noNegativeZero((fraction * 100).toFixed(1))} %` : DASH;
}

const PREFIXES: [number, string][] = [
  [1e9, 'G'],
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'µ'],
  [1e-9, 'n'],
];

/** Engineering notation with an SI prefix and three significant figures: 4700 Ω → "4.70 kΩ". */
export function formatSi(value: number, unit: string): string {
  if (!Number.isFinite(value)) return DASH;
  if (value === 0) return `0 ${unit}`;
  const abs = Math.abs(value);
  const [scale, prefix] = PREFIXES.find(([s]) => abs >= s * 0.9995) ?? PREFIXES[PREFIXES.length - 1];
  const scaled = value / scale;
  const text = Number(scaled.toPrecision(3)).toString();
  return `${text} ${prefix}${unit}`;
}

/** Any check value by its unit. */
export function formatQuantity(value: number, unit: string): string {
  switch (unit) {
    case 'V':
      return formatVolts(value);
    case 'A':
      return formatAmps(value);
    case 'W':
      return formatWatts(value);
    case 'ratio':
      return formatPercent(value);
    default:
      return formatSi(value, unit);
  }
}

/** Round up to a step, for "at least" advice (18.26 V → 18.3 V); float dust does not push it a step. */
export function ceilTo(x: number, step: number): number {
  return Number((Math.ceil(x / step - 1e-9) * step).toFixed(6));
}

/** Round down to a step, for "at most" advice. */
export function floorTo(x: number, step: number): number {
  return Number((Math.floor(x / step + 1e-9) * step).toFixed(6));
}
