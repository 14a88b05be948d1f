// The bench-check form as the person types it (strings), and its conversion to a KitSpec. Currents are
// entered in mA, duty and efficiency in %, inductance in µH and frequency in kHz; the spec is SI.
import { type KitSpec, kitSpecSchema } from '@/lib/electrical';

export type DriverType = 'buck' | 'linear' | 'resistor';

export type FormState = {
  supply: { volts: string; tolerancePct: string; maxAmps: string };
  driverType: DriverType;
  buck: {
    minInputVolts: string;
    maxInputVolts: string;
    outputMilliamps: string;
    headroomVolts: string;
    maxDutyPct: string;
    efficiencyPct: string;
    maxOutputVolts: string;
    inductorMicrohenries: string;
    switchingKilohertz: string;
  };
  linear: { maxInputVolts: string; outputMilliamps: string; dropoutVolts: string; maxWatts: string };
  resistor: { ohms: string; watts: string };
  string: { count: string; vfMin: string; vfTyp: string; vfMax: string; maxMilliamps: string; maxWatts: string };
  pwm: { on: boolean; dutyPct: string };
  wiring: { on: boolean; lengthMeters: string; awg: string };
};

/** A 24 V 2 A supply, a 350 mA buck driver (6–36 V in) and five white LEDs: comfortably ok (a sixth turns it to caution). */
export const DEFAULT_FORM: FormState = {
  supply: { volts: '24', tolerancePct: '5', maxAmps: '2' },
  driverType: 'buck',
  buck: {
    minInputVolts: '6',
    maxInputVolts: '36',
    outputMilliamps: '350',
    headroomVolts: '1.5',
    maxDutyPct: '95',
    efficiencyPct: '90',
    maxOutputVolts: '',
    inductorMicrohenries: '',
    switchingKilohertz: '',
  },
  linear: { maxInputVolts: '30', outputMilliamps: '350', dropoutVolts: '1.2', maxWatts: '' },
  resistor: { ohms: '33', watts: '2' },
  string: { count: '5', vfMin: '2.8', vfTyp: '3.0', vfMax: '3.4', maxMilliamps: '700', maxWatts: '3' },
  pwm: { on: false, dutyPct: '50' },
  wiring: { on: false, lengthMeters: '2', awg: '22' },
};

/** Form field → spec path, so that a zod issue lands on the input that caused it. */
export const FIELD_FOR_PATH: Record<string, string> = {
  'supply.volts': 'supply.volts',
  'supply.tolerancePct': 'supply.tolerancePct',
  'supply.maxAmps': 'supply.maxAmps',
  'driver.minInputVolts': 'buck.minInputVolts',
  'driver.headroomVolts': 'buck.headroomVolts',
  'driver.maxDuty': 'buck.maxDutyPct',
  'driver.efficiency': 'buck.efficiencyPct',
  'driver.maxOutputVolts': 'buck.maxOutputVolts',
  'driver.inductorHenries': 'buck.inductorMicrohenries',
  'driver.switchingHz': 'buck.switchingKilohertz',
  'driver.dropoutVolts': 'linear.dropoutVolts',
  'driver.maxWatts': 'linear.maxWatts',
  'driver.ohms': 'resistor.ohms',
  'driver.watts': 'resistor.watts',
  'string.count': 'string.count',
  'string.led.vfMin': 'string.vfMin',
  'string.led.vfTyp': 'string.vfTyp',
  'string.led.vfMax': 'string.vfMax',
  'string.led.maxAmps': 'string.maxMilliamps',
  'string.led.maxWatts': 'string.maxWatts',
  pwmDuty: 'pwm.dutyPct',
  'wiring.lengthMeters': 'wiring.lengthMeters',
  'wiring.awg': 'wiring.awg',
};

// Fields entered in a scaled unit: the schema's words ("cannot be more than 1") would confuse there.
const SCALED_MESSAGE: Record<string, string> = {
  'buck.maxDutyPct': 'Enter a percentage above 0 and at most 100',
  'buck.efficiencyPct': 'Enter a percentage above 0 and at most 100',
  'pwm.dutyPct': 'Enter a percentage above 0 and at most 100',
};

/** Empty text → undefined (optional fields); anything else → a number (NaN when not one). */
function num(text: string): number | undefined {
  const t = text.trim().replace(',', '.');
  return t === '' ? undefined : Number(t);
}
/** A value typed in a scaled unit, in SI: `unitsPerSi` is 1000 for mA, 100 for %, 1e-3 for kHz. */
const scaled = (text: string, unitsPerSi: number) => {
  const n = num(text);
  if (n === undefined) return undefined;
  // Dividing by a power of ten (rather than multiplying by 1e-3) keeps 350 mA exactly 0.35 A.
  return unitsPerSi >= 1 ? n / unitsPerSi : n * (1 / unitsPerSi);
};
/** Required fields: empty is an error, so send NaN rather than leave the key out. */
const required = (text: string, unitsPerSi = 1) => scaled(text, unitsPerSi) ?? Number.NaN;

function driverOf(f: FormState): unknown {
  if (f.driverType === 'buck') {
    const b = f.buck;
    return {
      type: 'buck',
      minInputVolts: required(b.minInputVolts),
      maxInputVolts: required(b.maxInputVolts),
      outputAmps: required(b.outputMilliamps, 1000),
      headroomVolts: num(b.headroomVolts),
      maxDuty: scaled(b.maxDutyPct, 100),
      efficiency: scaled(b.efficiencyPct, 100),
      maxOutputVolts: num(b.maxOutputVolts),
      inductorHenries: scaled(b.inductorMicrohenries, 1e6),
      switchingHz: scaled(b.switchingKilohertz, 1e-3),
    };
  }
  if (f.driverType === 'linear') {
    const l = f.linear;
    return {
      type: 'linear',
      maxInputVolts: required(l.maxInputVolts),
      outputAmps: required(l.outputMilliamps, 1000),
      dropoutVolts: required(l.dropoutVolts),
      maxWatts: num(l.maxWatts),
    };
  }
  return { type: 'resistor', ohms: required(f.resistor.ohms), watts: required(f.resistor.watts) };
}

const dropUndefined = (o: unknown): unknown =>
  o && typeof o === 'object' && !Array.isArray(o)
    ? Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined).map(([k, v]) => [k, dropUndefined(v)]))
    : o;

export type FormResult = { spec: KitSpec | null; errors: Record<string, string> };

/** Builds the spec and validates it with the same schema as the server; errors keyed by form field. */
export function specFromForm(f: FormState): FormResult {
  const raw = dropUndefined({
    supply: { volts: required(f.supply.volts), tolerancePct: num(f.supply.tolerancePct), maxAmps: required(f.supply.maxAmps) },
    driver: driverOf(f),
    string: {
      count: required(f.string.count),
      led: {
        vfMin: required(f.string.vfMin),
        vfTyp: required(f.string.vfTyp),
        vfMax: required(f.string.vfMax),
        maxAmps: required(f.string.maxMilliamps, 1000),
        maxWatts: required(f.string.maxWatts),
      },
    },
    pwmDuty: f.pwm.on ? required(f.pwm.dutyPct, 100) : undefined,
    wiring: f.wiring.on ? { lengthMeters: required(f.wiring.lengthMeters), awg: required(f.wiring.awg) } : undefined,
  });
  const parsed = kitSpecSchema.safeParse(raw);
  if (parsed.success) return { spec: raw as KitSpec, errors: {} };
  const errors: Record<string, string> = {};
  for (const issue of parsed.error.issues) {
    const path = issue.path.join('.');
    const field = fieldFor(path, f.driverType);
    errors[field] ??= SCALED_MESSAGE[field] ?? issue.message;
  }
  return { spec: null, errors };
}

/** Driver fields shared by two driver types map to the one on screen. */
function fieldFor(path: string, driverType: DriverType): string {
  if (path === 'driver.maxInputVolts') return `${driverType === 'linear' ? 'linear' : 'buck'}.maxInputVolts`;
  if (path === 'driver.outputAmps') return `${driverType === 'linear' ? 'linear' : 'buck'}.outputMilliamps`;
  return FIELD_FOR_PATH[path] ?? path;
}
