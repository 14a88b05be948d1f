// Display precision for the product: volts to 0.1 V, currents to the milliamp, watts to 0.01 W.

const DASH = '—';
const noNegativeZero = (s: string) => (/^-0(\.0+)?$/.test(s) ? s.slice(1) : s);

// `extra` adds decimals beyond the display precision (formatPair uses it); toFixed takes at most 100.
const fixed = (x: number, digits: number) => noNegativeZero(x.toFixed(Math.min(100, digits)));

export function formatVolts(v: number, extra = 0): string {
  return Number.isFinite(v) ? `${fixed(v, 1 + extra)} V` : DASH;
}

/** Milliamps under 1 A, amps from 1 A up; `scaleOf` picks the unit (so a pair prints in one unit). */
export function formatAmps(a: number, extra = 0, scaleOf = a): string {
  if (!Number.isFinite(a)) return DASH;
  if (Math.abs(scaleOf) < 1) return `${fixed(a * 1000, extra)} mA`;
  return `${fixed(a, 3 + extra)} A`;
}

export function formatWatts(w: number, extra = 0): string {
  return Number.isFinite(w) ? `${fixed(w, 2 + extra)} W` : DASH;
}

/** A fraction (0.877) as a percentage ("87.7 %"). */
export function formatPercent(fraction: number, extra = 0): string {
  return Number.isFinite(fraction) ? `${fixed(fraction * 100, 1 + extra)} %` : DASH;
}

/** Temperatures to the degree. */
export function formatCelsius(c: number, extra = 0): string {
  return Number.isFinite(c) ? `${fixed(c, extra)} °C` : DASH;
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
export function formatSi(value: number, unit: string, extra = 0, scaleOf = value): string {
  if (!Number.isFinite(value)) return DASH;
  if (value === 0 && scaleOf === 0) return `0 ${unit}`;
  const abs = Math.abs(scaleOf);
  const [scale, prefix] = PREFIXES.find(([s]) => abs >= s * 0.9995) ?? PREFIXES[PREFIXES.length - 1];
  const scaled = value / scale;
  const text = Number(scaled.toPrecision(Math.min(100, 3 + extra))).toString();
  return `${text} ${prefix}${unit}`;
}

/** Any check value by its unit; `extra` decimals beyond the display precision. */
export function formatQuantity(value: number, unit: string, extra = 0, scaleOf = value): string {
  switch (unit) {
    case 'V':
      return formatVolts(value, extra);
    case 'A':
      return formatAmps(value, extra, scaleOf);
    case 'W':
      return formatWatts(value, extra);
    case 'ratio':
      return formatPercent(value, extra);
    case '°C':
      return formatCelsius(value, extra);
    case 'A/mm²':
    case '°C/W':
      return Number.isFinite(value) ? `${fixed(value, 1 + extra)} ${unit}` : DASH;
    default:
      return formatSi(value, unit, extra, scaleOf);
  }
}

/**
 * A value and its limit printed at one precision, with as many extra decimals as it takes for two
 * different numbers not to print alike ("13.49 V, short of the 13.50 V" rather than "13.5 V … 13.5 V").
 * Numbers equal within the check's tolerance (1e-9 relative) may print alike: the check treats them as equal.
 */
export function formatPair(value: number, limit: number, unit: string): [string, string] {
  const scaleOf = Math.max(Math.abs(value), Math.abs(limit));
  const equal = Math.abs(value - limit) <= 1e-9 * Math.abs(limit);
  let a = formatQuantity(value, unit, 0, scaleOf);
  let b = formatQuantity(limit, unit, 0, scaleOf);
  for (let extra = 1; a === b && !equal && extra <= 20; extra++) {
    a = formatQuantity(value, unit, extra, scaleOf);
    b = formatQuantity(limit, unit, extra, scaleOf);
  }
  return [a, b];
}

/** Round up to a step, for "at least" advice (18.26 V → 18.3 V); float dust does not push it a step. */
export function ceilTo(x: number, step: number): number {
  return Number((Math.ceil(x / step - 1e-9) * step).toFixed(6));
}

/** Round down to a step, for "at most" advice. */
export function floorTo(x: number, step: number): number {
  return Number((Math.floor(x / step + 1e-9) * step).toFixed(6));
}
