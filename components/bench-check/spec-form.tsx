import { awgName, MAX_AWG, MIN_AWG } from '@/lib/electrical';
import type { DriverType, FormState } from './form-state';
import { NumberField } from './number-field';

type Props = {
  form: FormState;
  errors: Record<string, string>;
  echoes: Record<string, string>;
  onChange: (next: FormState) => void;
};

type Group = Exclude<keyof FormState, 'driverType'>;

const DRIVER_CHOICES: { value: DriverType; label: string; note: string }[] = [
  { value: 'buck', label: 'Buck', note: 'switching, constant current' },
  { value: 'linear', label: 'Linear', note: 'constant current, burns the spare volts' },
  { value: 'resistor', label: 'Resistor', note: 'a series resistor sets the current' },
];

const AWG_CHOICES = Array.from({ length: MAX_AWG - MIN_AWG + 1 }, (_, i) => MIN_AWG + i);

/** The build: supply, driver, LED string, and the optional PWM dimming and wire run. */
export function SpecForm({ form, errors, echoes, onChange }: Props) {
  // Typed setter for one group of fields.
  const set =
    <G extends Group>(group: G) =>
    (key: keyof FormState[G]) =>
    (value: FormState[G][keyof FormState[G]]) =>
      onChange({ ...form, [group]: { ...form[group], [key]: value } });
  const field = <G extends Group>(group: G, key: keyof FormState[G] & string) => ({
    name: `${group}.${key}`,
    value: form[group][key] as string,
    onChange: set(group)(key) as (v: string) => void,
    error: errors[`${group}.${key}`],
    echo: echoes[`${group}.${key}`],
  });

  return (
    <form className="space-y-5" onSubmit={(e) => e.preventDefault()} noValidate>
      <fieldset className="card min-w-0 space-y-3">
        <legend className="px-1 text-base font-bold">Supply (DC)</legend>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
          <NumberField label="Voltage" unit="V" {...field('supply', 'volts')} />
          <NumberField label="Tolerance" unit="± %" {...field('supply', 'tolerancePct')} hint="5 % if unknown" />
          <NumberField label="Current rating" unit="A" {...field('supply', 'maxAmps')} />
        </div>
      </fieldset>

      <fieldset className="card min-w-0 space-y-3">
        <legend className="px-1 text-base font-bold">Driver</legend>
        <div role="radiogroup" aria-label="Driver type" className="grid grid-cols-3 gap-1.5">
          {DRIVER_CHOICES.map((c) => (
            <label
              key={c.value}
              className="flex min-h-11 cursor-pointer flex-col justify-center rounded-lg border border-stone-300 px-2 py-2 text-sm has-checked:border-accent has-checked:bg-accent-soft/60 dark:border-stone-600 dark:has-checked:border-teal-400 dark:has-checked:bg-teal-950"
            >
              <span className="flex items-center gap-1.5 font-semibold">
                <input
                  type="radio"
                  name="driverType"
                  value={c.value}
                  checked={form.driverType === c.value}
                  onChange={() => onChange({ ...form, driverType: c.value })}
                  className="accent-accent"
                />
                {c.label}
              </span>
              <span className="muted hidden text-xs sm:block">{c.note}</span>
            </label>
          ))}
        </div>

        {form.driverType === 'buck' ? (
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
            <NumberField label="Minimum input" unit="V" {...field('buck', 'minInputVolts')} />
            <NumberField label="Maximum input" unit="V" {...field('buck', 'maxInputVolts')} />
            <NumberField label="Output current" unit="mA" {...field('buck', 'outputMilliamps')} />
            <NumberField label="Headroom" unit="V" {...field('buck', 'headroomVolts')} hint="input above the string it needs" />
            <NumberField label="Maximum duty" unit="%" {...field('buck', 'maxDutyPct')} />
            <NumberField label="Efficiency" unit="%" {...field('buck', 'efficiencyPct')} />
            <NumberField label="Maximum output" unit="V" optional {...field('buck', 'maxOutputVolts')} />
            <NumberField label="Inductor" unit="µH" optional {...field('buck', 'inductorMicrohenries')} hint="microhenries: 68 µH is 68" />
            <NumberField label="Switching frequency" unit="kHz" optional {...field('buck', 'switchingKilohertz')} hint="kilohertz: 300 kHz is 300" />
            <NumberField label="Inductor saturation" unit="A" optional {...field('buck', 'inductorSatAmps')} hint="amperes, from the inductor's datasheet" />
          </div>
        ) : form.driverType === 'linear' ? (
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
            <NumberField label="Maximum input" unit="V" {...field('linear', 'maxInputVolts')} />
            <NumberField label="Output current" unit="mA" {...field('linear', 'outputMilliamps')} />
            <NumberField label="Dropout" unit="V" {...field('linear', 'dropoutVolts')} />
            <NumberField label="Power rating" unit="W" optional {...field('linear', 'maxWatts')} />
            <NumberField label="Its heat sink" unit="°C/W" optional {...field('linear', 'sinkCPerW')} hint="none: in free air" />
            <NumberField label="Junction to case" unit="°C/W" optional {...field('linear', 'junctionToCaseCPerW')} hint="5 if unknown" />
            <NumberField label="Max junction" unit="°C" optional {...field('linear', 'maxJunctionC')} hint="125 if unknown" />
          </div>
        ) : (
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
            <NumberField label="Resistance" unit="Ω" {...field('resistor', 'ohms')} />
            <NumberField label="Power rating" unit="W" {...field('resistor', 'watts')} />
          </div>
        )}
      </fieldset>

      <fieldset className="card min-w-0 space-y-3">
        <legend className="px-1 text-base font-bold">LED string</legend>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
          <NumberField label="LEDs in series" {...field('string', 'count')} />
          <NumberField label="Forward voltage, min" unit="V" {...field('string', 'vfMin')} />
          <NumberField label="Forward voltage, typical" unit="V" {...field('string', 'vfTyp')} />
          <NumberField label="Forward voltage, max" unit="V" {...field('string', 'vfMax')} hint="at the drive current" />
          <NumberField label="LED current rating" unit="mA" {...field('string', 'maxMilliamps')} />
          <NumberField label="LED power rating" unit="W" {...field('string', 'maxWatts')} />
          <NumberField label="Junction to solder point" unit="°C/W" optional {...field('string', 'thermalOhmsJs')} hint="8 if unknown" />
          <NumberField label="Max junction" unit="°C" optional {...field('string', 'maxJunctionC')} hint="125 if unknown" />
        </div>
      </fieldset>

      <fieldset className="card min-w-0 space-y-3">
        <legend className="px-1 text-base font-bold">Heat</legend>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
          <NumberField label="Room temperature" unit="°C" optional {...field('ambient', 'ambientC')} hint="25 if left empty" />
        </div>
        <Toggle label="LEDs mounted on heat sinks" checked={form.heatSink.on} onChange={set('heatSink')('on')} />
        {form.heatSink.on ? (
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
            <NumberField label="Heat sinks" {...field('heatSink', 'count')} hint="the LEDs share them evenly" />
            <NumberField label="Each sink" unit="°C/W" {...field('heatSink', 'cPerW')} hint="sink to air" />
          </div>
        ) : (
          <p className="muted text-sm">Without a sink each LED sits on its bare star board in still air.</p>
        )}
      </fieldset>

      <fieldset className="card min-w-0 space-y-3">
        <legend className="px-1 text-base font-bold">Dimming and wiring</legend>
        <Toggle label="Dimmed with PWM" checked={form.pwm.on} onChange={set('pwm')('on')} />
        {form.pwm.on ? (
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
            <NumberField label="PWM duty" unit="%" {...field('pwm', 'dutyPct')} />
          </div>
        ) : null}
        <Toggle label="Wire run from the supply to the driver" checked={form.wiring.on} onChange={set('wiring')('on')} />
        {form.wiring.on ? (
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
            <NumberField label="Length, one way" unit="m" {...field('wiring', 'lengthMeters')} />
            <AwgSelect value={form.wiring.awg} onChange={set('wiring')('awg') as (v: string) => void} error={errors['wiring.awg']} />
          </div>
        ) : null}
      </fieldset>
    </form>
  );
}

function Toggle({ label, checked, onChange }: { label: string; checked: boolean; onChange: (on: boolean) => void }) {
  return (
    <label className="flex min-h-11 items-center gap-3 text-sm font-semibold">
      <input type="checkbox" className="size-5 accent-accent" checked={checked} onChange={(e) => onChange(e.target.checked)} />
      {label}
    </label>
  );
}

function AwgSelect({ value, onChange, error }: { value: string; onChange: (v: string) => void; error?: string }) {
  return (
    <div>
      <label htmlFor="bench-awg" className="label">
        Wire gauge <span className="font-normal text-stone-500 dark:text-stone-400">(AWG)</span>
      </label>
      <select id="bench-awg" name="wiring.awg" data-field="wiring.awg" className="field" value={value} onChange={(e) => onChange(e.target.value)} aria-invalid={error ? true : undefined}>
        {AWG_CHOICES.map((n) => (
          <option key={n} value={String(n)}>
            {awgName(n)} AWG
          </option>
        ))}
      </select>
      {error ? <p className="mt-1 text-sm font-semibold text-red-800 dark:text-red-300">{error}</p> : null}
    </div>
  );
}
