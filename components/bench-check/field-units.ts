// Fields typed in a unit other than the spec's SI one: how to convert, what to echo back, and how to word
// the schema's limits in the unit on screen (the schema speaks amperes and hertz; the field says mA, kHz).
import type { z } from 'zod';

type FieldUnit = {
  /** The unit on screen, and how many of it make one SI unit (1000 mA per A, 1e-3 kHz per Hz). */
  unit: string;
  perSi: number;
  toSi: (typed: number) => number;
  /** The converted value, shown under the field. */
  echo?: (si: number) => string;
};

// Dividing by a power of ten (rather than multiplying by 1e-3) keeps 350 mA exactly 0.35 A.
const divide = (n: number) => (v: number) => v / n;

const milliamps: FieldUnit = { unit: 'mA', perSi: 1000, toSi: divide(1000) };
const percent: FieldUnit = { unit: '%', perSi: 100, toSi: divide(100) };

/** 300000 → "300 000", 0.000068 → "0.000068": digits grouped by three, no exponent. */
export function groupDigits(n: number): string {
  if (!Number.isFinite(n)) return '—';
  const text = Math.abs(n) >= 1e21 || (n !== 0 && Math.abs(n) < 1e-9) ? n.toPrecision(6) : String(Number(n.toPrecision(12)));
  if (/e/i.test(text)) return text;
  const [int, frac] = text.split('.');
  const grouped = int.replace(/\B(?=(\d{3})+(?!\d))/g, '\u202f');
  return frac ? `${grouped}.${frac}` : grouped;
}

export const FIELD_UNITS: Record<string, FieldUnit> = {
  'buck.outputMilliamps': milliamps,
  'linear.outputMilliamps': milliamps,
  'string.maxMilliamps': milliamps,
  'buck.maxDutyPct': percent,
  'buck.efficiencyPct': percent,
  'pwm.dutyPct': percent,
  'buck.inductorMicrohenries': { unit: 'µH', perSi: 1e6, toSi: divide(1e6), echo: (h) => `= ${groupDigits(h)} H` },
  'buck.switchingKilohertz': { unit: 'kHz', perSi: 1e-3, toSi: (k) => k * 1000, echo: (hz) => `= ${groupDigits(hz)} Hz` },
};

/** A bound from the schema, in the field's unit. */
const inUnit = (si: number, u: FieldUnit) => `${groupDigits(Number((si * u.perSi).toPrecision(12)))} ${u.unit}`;

/**
 * The schema's "too big / too small" in the field's own unit, with a hint when the typed number looks
 * like it was meant in another unit (300000 in a kHz field is 300 kHz typed in hertz).
 */
export function scaledIssueMessage(field: string, issue: z.core.$ZodIssue, si: number | undefined): string | undefined {
  const u = FIELD_UNITS[field];
  if (!u || (issue.code !== 'too_big' && issue.code !== 'too_small')) return undefined;
  const bound = Number(issue.code === 'too_big' ? issue.maximum : issue.minimum);
  const inclusive = issue.inclusive !== false;
  const base =
    issue.code === 'too_big'
      ? `Cannot be more than ${inUnit(bound, u)}`
      : inclusive
        ? `Must be at least ${inUnit(bound, u)}`
        : `Must be more than ${inUnit(bound, u)}`;
  if (si === undefined) return base;
  if (field === 'buck.switchingKilohertz' && issue.code === 'too_big')
    return `${base}. This field is in kHz: for ${groupDigits(si / 1000 / 1000)} kHz, type ${groupDigits(si / 1000 / 1000)}`;
  if (field === 'buck.switchingKilohertz' && issue.code === 'too_small')
    return `${base}. This field is in kHz: 1 MHz is 1000 kHz`;
  if (field === 'buck.inductorMicrohenries' && issue.code === 'too_small')
    return `${base}. This field is in µH: for ${groupDigits(si * 1e6 * 1e6)} µH, type ${groupDigits(si * 1e6 * 1e6)}`;
  return base;
}
