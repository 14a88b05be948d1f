import { z } from 'zod';
import type { PartCategory } from '@/db/types';

// Electrical specs per part category, validated on every write. Field names match the
// compatibility check's KitSpec (lib/electrical) so a part's specs feed the check directly.
const pos = (what: string) =>
  z.coerce
    .number({ error: `${what} must be a number` })
    .finite()
    .positive(`${what} must be above 0`);
const nonneg = (what: string) =>
  z.coerce
    .number({ error: `${what} must be a number` })
    .finite()
    .nonnegative(`${what} must not be negative`);

export const driverSpecs = z
  .object({
    type: z.enum(['buck', 'linear', 'resistor']).default('buck'),
    minInputVolts: nonneg('minimum input volts').optional(),
    maxInputVolts: pos('maximum input volts').optional(),
    outputAmps: pos('output current').optional(),
    headroomVolts: nonneg('headroom').optional(),
    maxDuty: z.coerce.number().gt(0).max(1).optional(),
    efficiency: z.coerce.number().gt(0).max(1).optional(),
    maxOutputVolts: pos('maximum output volts').optional(),
    inductorHenries: pos('inductance').optional(),
    switchingHz: pos('switching frequency').optional(),
    dropoutVolts: nonneg('dropout').optional(),
    maxWatts: pos('maximum dissipation').optional(),
    ohms: pos('resistance').optional(),
    watts: pos('resistor rating').optional(),
    dimmable: z.coerce.boolean().optional(),
  })
  .superRefine((d, ctx) => {
    const need = (keys: (keyof typeof d)[]) =>
      keys.forEach(
        (k) =>
          d[k] === undefined &&
          ctx.addIssue({ code: 'custom', path: [k], message: `${k} is required for a ${d.type} driver` }),
      );
    if (d.type === 'buck') need(['minInputVolts', 'maxInputVolts', 'outputAmps']);
    if (d.type === 'linear') need(['maxInputVolts', 'outputAmps', 'dropoutVolts']);
    if (d.type === 'resistor') need(['ohms', 'watts']);
    if (d.minInputVolts !== undefined && d.maxInputVolts !== undefined && d.minInputVolts >= d.maxInputVolts)
      ctx.addIssue({
        code: 'custom',
        path: ['maxInputVolts'],
        message: 'maximum input must be above the minimum',
      });
  });

export const ledSpecs = z
  .object({
    vfMin: pos('minimum forward voltage'),
    vfTyp: pos('typical forward voltage'),
    vfMax: pos('maximum forward voltage'),
    atAmps: pos('test current').optional(),
    maxAmps: pos('maximum current'),
    maxWatts: pos('maximum power'),
    // Heat: junction to the star's solder point, and the hottest the junction may run. Optional; the
    // check assumes typical values for a 1–3 W star when they are not given.
    thermalOhmsJs: pos('junction-to-solder-point thermal resistance').max(200, 'at most 200 °C/W').optional(),
    maxJunctionC: z.coerce
      .number({ error: 'maximum junction temperature must be a number' })
      .finite()
      .min(50, 'at least 50 °C')
      .max(200, 'at most 200 °C')
      .optional(),
    colour: z.string().max(40).optional(),
  })
  .refine((l) => l.vfMin <= l.vfTyp && l.vfTyp <= l.vfMax, {
    path: ['vfTyp'],
    message: 'forward voltages must be min ≤ typ ≤ max',
  });

export const supplySpecs = z.object({
  volts: pos('output volts'),
  tolerancePct: nonneg('tolerance').max(50).default(5),
  maxAmps: pos('maximum current'),
  mains: z.coerce.boolean().default(true),
});

export const wireSpecs = z.object({
  awg: z.coerce.number().int().min(0).max(40),
  colour: z.string().max(40).optional(),
});
export const heatSinkSpecs = z.object({
  celsiusPerWatt: pos('thermal resistance').optional(),
  lengthMm: pos('length').optional(),
});
export const freeSpecs = z.record(
  z.string().max(60),
  z.union([z.string().max(200), z.number().finite(), z.boolean()]),
);

export const SPEC_SCHEMAS: Record<PartCategory, z.ZodType> = {
  driver: driverSpecs,
  led: ledSpecs,
  supply: supplySpecs,
  wire: wireSpecs,
  heat_sink: heatSinkSpecs,
  kit_box: freeSpecs,
  tool: freeSpecs,
  meter: freeSpecs,
  consumable: freeSpecs,
  other: freeSpecs,
};

export type DriverSpecs = z.infer<typeof driverSpecs>;
export type LedSpecs = z.infer<typeof ledSpecs>;
export type SupplySpecs = z.infer<typeof supplySpecs>;

/** One line of a part's key spec for labels and lists, e.g. "350 mA · 6–36 V in". */
export function keySpec(category: PartCategory, specs: Record<string, unknown>): string {
  const n = (k: string) => (typeof specs[k] === 'number' ? (specs[k] as number) : undefined);
  const mA = (a?: number) => (a === undefined ? '' : a < 1 ? `${Math.round(a * 1000)} mA` : `${a} A`);
  switch (category) {
    case 'driver':
      if (specs.type === 'resistor') return `${n('ohms')} Ω · ${n('watts')} W`;
      if (!n('maxInputVolts')) return mA(n('outputAmps'));
      // A linear driver states only its ceiling; "0–30 V" would claim it runs from nothing.
      return [
        mA(n('outputAmps')),
        n('minInputVolts') === undefined
          ? `up to ${n('maxInputVolts')} V in`
          : `${n('minInputVolts')}–${n('maxInputVolts')} V in`,
      ]
        .filter(Boolean)
        .join(' · ');
    case 'led':
      return [
        `Vf ${n('vfTyp')} V`,
        mA(n('maxAmps')) ? `max ${mA(n('maxAmps'))}` : '',
        n('maxWatts') ? `${n('maxWatts')} W` : '',
      ]
        .filter(Boolean)
        .join(' · ');
    case 'supply':
      return `${n('volts')} V ±${n('tolerancePct') ?? 5} % · ${mA(n('maxAmps'))}`;
    case 'wire':
      return `${n('awg')} AWG`;
    case 'heat_sink':
      return n('celsiusPerWatt') ? `${n('celsiusPerWatt')} °C/W` : '';
    default:
      return '';
  }
}

/** Spec values as forms and CSV cells send them: blank means "not given". */
function dropBlanks(raw: Record<string, unknown>): Record<string, unknown> {
  return Object.fromEntries(Object.entries(raw).filter(([, v]) => v !== '' && v !== null && v !== undefined));
}

export type SpecsResult =
  { ok: true; specs: Record<string, unknown> } | { ok: false; fields: Record<string, string[]> };

/**
 * Validates a part's specs against its category's schema. Errors are keyed by the dotted field,
 * prefixed `specs.` (e.g. `specs.maxInputVolts`), as the forms and the API name them.
 */
export function parseSpecs(category: PartCategory, raw: Record<string, unknown>): SpecsResult {
  const parsed = SPEC_SCHEMAS[category].safeParse(dropBlanks(raw));
  if (parsed.success) return { ok: true, specs: parsed.data as Record<string, unknown> };
  const fields: Record<string, string[]> = {};
  for (const issue of parsed.error.issues) {
    const key = ['specs', ...issue.path.map(String)].join('.');
    (fields[key] ??= []).push(issue.message);
  }
  return { ok: false, fields };
}
