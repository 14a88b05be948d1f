// The bench-check form as the person types it (strings), and its conversion to a KitSpec. Currents are
// entered in mA, duty and efficiency in %, inductance in µH and frequency in kHz; the spec is SI. The spec
// is validated with the check's own schema (same caps as the API); each problem lands on the field shown.
import { type KitSpec, kitSpecSchema } from '@/lib/electrical';
import { type ParsedNumber, parseTypedNumber } from './typed-number';
import { FIELD_UNITS, scaledIssueMessage } from './field-units';

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
    inductorSatAmps: string;
  };
  linear: {
    maxInputVolts: string;
    outputMilliamps: string;
    dropoutVolts: string;
    maxWatts: string;
    sinkCPerW: string;
    junctionToCaseCPerW: string;
    maxJunctionC: string;
  };
  resistor: { ohms: string; watts: string };
  string: {
    count: string;
    vfMin: string;
    vfTyp: string;
    vfMax: string;
    maxMilliamps: string;
    maxWatts: string;
    thermalOhmsJs: string;
    maxJunctionC: string;
  };
  pwm: { on: boolean; dutyPct: string };
  wiring: { on: boolean; lengthMeters: string; awg: string };
  heatSink: { on: boolean; count: string; cPerW: string };
  ambient: { ambientC: string };
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
    inductorSatAmps: '',
  },
  linear: { maxInputVolts: '30', outputMilliamps: '350', dropoutVolts: '1.2', maxWatts: '', sinkCPerW: '', junctionToCaseCPerW: '', maxJunctionC: '' },
  resistor: { ohms: '33', watts: '2' },
  string: { count: '5', vfMin: '2.8', vfTyp: '3.0', vfMax: '3.4', maxMilliamps: '700', maxWatts: '3', thermalOhmsJs: '', maxJunctionC: '' },
  pwm: { on: false, dutyPct: '50' },
  wiring: { on: false, lengthMeters: '2', awg: '22' },
  heatSink: { on: false, count: '1', cPerW: '10' },
  ambient: { ambientC: '' },
};

/** Form field → spec path (driver fields shared by two driver types are resolved in fieldFor). */
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
  'driver.inductorSatAmps': 'buck.inductorSatAmps',
  'driver.dropoutVolts': 'linear.dropoutVolts',
  'driver.sinkCPerW': 'linear.sinkCPerW',
  'driver.junctionToCaseCPerW': 'linear.junctionToCaseCPerW',
  'driver.ohms': 'resistor.ohms',
  'driver.watts': 'resistor.watts',
  'string.count': 'string.count',
  'string.led.vfMin': 'string.vfMin',
  'string.led.vfTyp': 'string.vfTyp',
  'string.led.vfMax': 'string.vfMax',
  'string.led.maxAmps': 'string.maxMilliamps',
  'string.led.maxWatts': 'string.maxWatts',
  'string.led.thermalOhmsJs': 'string.thermalOhmsJs',
  'string.led.maxJunctionC': 'string.maxJunctionC',
  pwmDuty: 'pwm.dutyPct',
  'wiring.lengthMeters': 'wiring.lengthMeters',
  'wiring.awg': 'wiring.awg',
  'heatSink.count': 'heatSink.count',
  'heatSink.cPerW': 'heatSink.cPerW',
  ambientC: 'ambient.ambientC',
};

/** Driver fields shared by two driver types map to the one on screen. */
export function fieldFor(path: string, driverType: DriverType): string {
  const own = driverType === 'linear' ? 'linear' : 'buck';
  if (path === 'driver.maxInputVolts') return `${own}.maxInputVolts`;
  if (path === 'driver.outputAmps') return `${own}.outputMilliamps`;
  if (path === 'driver.maxWatts') return 'linear.maxWatts';
  if (path === 'driver.maxJunctionC') return 'linear.maxJunctionC';
  return FIELD_FOR_PATH[path] ?? path;
}

export type FormResult = {
  spec: KitSpec | null;
  /** Form field → what is wrong with it, in the field's own unit. */
  errors: Record<string, string>;
  /** Form field → how the typed text was read ("= 300 000 Hz", "read as 3.2"). */
  echoes: Record<string, string>;
};

/** Reads every visible field, builds the spec, and validates it with the check's schema. */
export function specFromForm(f: FormState): FormResult {
  const errors: Record<string, string> = {};
  const echoes: Record<string, string> = {};
  const siValues: Record<string, number> = {};

  // One typed field → its SI value; undefined when empty and optional. Text that is not a number, or a
  // required field left empty, is marked here, before the schema sees a NaN.
  const read = (field: string, text: string, required: boolean): number | undefined => {
    const parsed: ParsedNumber = parseTypedNumber(text);
    if (parsed.kind === 'empty') {
      if (required) errors[field] = 'Required: enter a value';
      return required ? Number.NaN : undefined;
    }
    if (parsed.kind === 'bad') {
      errors[field] = parsed.message;
      return Number.NaN;
    }
    const unit = FIELD_UNITS[field];
    const si = unit ? unit.toSi(parsed.value) : parsed.value;
    siValues[field] = si;
    const echo = unit?.echo?.(si);
    if (echo) echoes[field] = echo;
    else if (parsed.readAs) echoes[field] = `read as ${parsed.readAs}`;
    return si;
  };
  const req = (group: keyof FormState, key: string) => read(`${group}.${key}`, textOf(f, group, key), true);
  const opt = (group: keyof FormState, key: string) => read(`${group}.${key}`, textOf(f, group, key), false);

  const raw = dropUndefined({
    supply: { volts: req('supply', 'volts'), tolerancePct: opt('supply', 'tolerancePct'), maxAmps: req('supply', 'maxAmps') },
    driver: driverOf(f, req, opt),
    string: {
      count: req('string', 'count'),
      led: {
        vfMin: req('string', 'vfMin'),
        vfTyp: req('string', 'vfTyp'),
        vfMax: req('string', 'vfMax'),
        maxAmps: req('string', 'maxMilliamps'),
        maxWatts: req('string', 'maxWatts'),
        thermalOhmsJs: opt('string', 'thermalOhmsJs'),
        maxJunctionC: opt('string', 'maxJunctionC'),
      },
    },
    pwmDuty: f.pwm.on ? req('pwm', 'dutyPct') : undefined,
    wiring: f.wiring.on ? { lengthMeters: req('wiring', 'lengthMeters'), awg: req('wiring', 'awg') } : undefined,
    heatSink: f.heatSink.on ? { count: req('heatSink', 'count'), cPerW: req('heatSink', 'cPerW') } : undefined,
    ambientC: opt('ambient', 'ambientC'),
  });

  const parsed = kitSpecSchema.safeParse(raw);
  if (parsed.success && Object.keys(errors).length === 0) return { spec: raw as KitSpec, errors, echoes };
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const field = fieldFor(issue.path.map(String).join('.'), f.driverType);
      if (errors[field]) continue; // "not a number" or "required" already says it best
      errors[field] = scaledIssueMessage(field, issue, siValues[field]) ?? issue.message;
    }
  }
  for (const field of Object.keys(errors)) delete echoes[field];
  return { spec: null, errors, echoes };
}

type Reader = (group: keyof FormState, key: string) => number | undefined;

function driverOf(f: FormState, req: Reader, opt: Reader): unknown {
  if (f.driverType === 'buck')
    return {
      type: 'buck',
      minInputVolts: req('buck', 'minInputVolts'),
      maxInputVolts: req('buck', 'maxInputVolts'),
      outputAmps: req('buck', 'outputMilliamps'),
      headroomVolts: opt('buck', 'headroomVolts'),
      maxDuty: opt('buck', 'maxDutyPct'),
      efficiency: opt('buck', 'efficiencyPct'),
      maxOutputVolts: opt('buck', 'maxOutputVolts'),
      inductorHenries: opt('buck', 'inductorMicrohenries'),
      switchingHz: opt('buck', 'switchingKilohertz'),
      inductorSatAmps: opt('buck', 'inductorSatAmps'),
    };
  if (f.driverType === 'linear')
    return {
      type: 'linear',
      maxInputVolts: req('linear', 'maxInputVolts'),
      outputAmps: req('linear', 'outputMilliamps'),
      dropoutVolts: req('linear', 'dropoutVolts'),
      maxWatts: opt('linear', 'maxWatts'),
      sinkCPerW: opt('linear', 'sinkCPerW'),
      junctionToCaseCPerW: opt('linear', 'junctionToCaseCPerW'),
      maxJunctionC: opt('linear', 'maxJunctionC'),
    };
  return { type: 'resistor', ohms: req('resistor', 'ohms'), watts: req('resistor', 'watts') };
}

function textOf(f: FormState, group: keyof FormState, key: string): string {
  const g = f[group] as Record<string, unknown>;
  const v = g?.[key];
  return typeof v === 'string' ? v : '';
}

const dropUndefined = (o: unknown): unknown =>
  o && typeof o === 'object' && !Array.isArray(o)
    ? Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined).map(([k, v]) => [k, dropUndefined(v)]))
    : o;

/**
 * A saved draft (sessionStorage) laid over the defaults: only known keys with values of the right type,
 * so an old or tampered draft can never break the page.
 */
export function restoreForm(saved: unknown): FormState {
  const out = structuredClone(DEFAULT_FORM);
  if (!saved || typeof saved !== 'object') return out;
  const s = saved as Record<string, unknown>;
  if (s.driverType === 'buck' || s.driverType === 'linear' || s.driverType === 'resistor') out.driverType = s.driverType;
  for (const group of Object.keys(out) as (keyof FormState)[]) {
    if (group === 'driverType') continue;
    const target = out[group] as Record<string, string | boolean>;
    const source = s[group];
    if (!source || typeof source !== 'object') continue;
    for (const [k, v] of Object.entries(source as Record<string, unknown>))
      if (k in target && typeof v === typeof target[k] && (typeof v !== 'string' || v.length <= 60)) target[k] = v as string | boolean;
  }
  return out;
}
