import { describe, expect, it } from 'vitest';
import { DEFAULT_FORM, type FormState, restoreForm, specFromForm } from '@/components/bench-check/form-state';
import { checkKit } from '@/lib/electrical';

const withForm = (patch: (f: FormState) => FormState) => specFromForm(patch(structuredClone(DEFAULT_FORM)));

describe('bench-check form → KitSpec', () => {
  it('the example build converts mA, % and leaves optional fields out', () => {
    const { spec, errors } = specFromForm(DEFAULT_FORM);
    expect(errors).toEqual({});
    expect(spec).toEqual({
      supply: { volts: 24, tolerancePct: 5, maxAmps: 2 },
      driver: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35, headroomVolts: 1.5, maxDuty: 0.95, efficiency: 0.9 },
      string: { count: 5, led: { vfMin: 2.8, vfTyp: 3, vfMax: 3.4, maxAmps: 0.7, maxWatts: 3 } },
    });
    expect(checkKit(spec!).verdict).toBe('ok');
    // A sixth LED: worst-case duty 6 × 3.4 / (22.8 × 0.9) = 99.4 % passes the 95 % limit → caution.
    expect(checkKit({ ...spec!, string: { ...spec!.string, count: 6 } }).verdict).toBe('caution');
  });

  it('µH and kHz become henries and hertz; a comma works as a decimal point', () => {
    const { spec } = withForm((f) => ({ ...f, buck: { ...f.buck, inductorMicrohenries: '68', switchingKilohertz: '300' }, supply: { ...f.supply, volts: '24,5' } }));
    expect(spec?.driver).toMatchObject({ inductorHenries: 68e-6, switchingHz: 300e3 });
    expect(spec?.supply.volts).toBe(24.5);
  });

  it('an empty required field is named, an empty optional one is not', () => {
    const { spec, errors } = withForm((f) => ({ ...f, supply: { ...f.supply, volts: '' }, buck: { ...f.buck, maxOutputVolts: '' } }));
    expect(spec).toBeNull();
    expect(Object.keys(errors)).toEqual(['supply.volts']);
  });

  it('errors land on the field on screen, in its own unit', () => {
    const { errors } = withForm((f) => ({ ...f, buck: { ...f.buck, efficiencyPct: '120' }, string: { ...f.string, vfMin: '3.2' } }));
    expect(errors['buck.efficiencyPct']).toBe('Cannot be more than 100 %');
    expect(errors['string.vfMin']).toMatch(/above the typical/);
  });

  it('the linear and resistor forms, PWM and a wire run', () => {
    const linear = withForm((f) => ({ ...f, driverType: 'linear', pwm: { on: true, dutyPct: '40' }, wiring: { on: true, lengthMeters: '3', awg: '-1' } }));
    expect(linear.spec?.driver).toEqual({ type: 'linear', maxInputVolts: 30, outputAmps: 0.35, dropoutVolts: 1.2 });
    expect(linear.spec?.pwmDuty).toBeCloseTo(0.4, 12);
    expect(linear.spec?.wiring).toEqual({ lengthMeters: 3, awg: -1 });
    const resistor = withForm((f) => ({ ...f, driverType: 'resistor', linear: { ...f.linear, outputMilliamps: 'x' } }));
    // a bad value in a hidden driver's fields does not block the one shown
    expect(resistor.errors).toEqual({});
    expect(resistor.spec?.driver).toEqual({ type: 'resistor', ohms: 33, watts: 2 });
    const badLinear = withForm((f) => ({ ...f, driverType: 'linear', linear: { ...f.linear, outputMilliamps: 'x' } }));
    expect(Object.keys(badLinear.errors)).toEqual(['linear.outputMilliamps']);
  });
});

describe('bench-check form: what people mistype', () => {
  const supplyVolts = (text: string) => withForm((f) => ({ ...f, supply: { ...f.supply, volts: text } }));

  it.each([
    ['1e308', /cannot be more than 1000 V/],
    ['-5', /greater than 0/],
    ['twelve', /Enter a number/],
    ['12V', /Enter a number/],
    ['', /Required/],
    ['1e400', /too large/],
    ['1,000.5', /one decimal mark/],
    ['Infinity', /Enter a number/],
    ['0x10', /Enter a number/],
  ])('supply voltage %j is refused on that field alone: %s', (text, message) => {
    const { spec, errors } = supplyVolts(text);
    expect(spec).toBeNull();
    expect(Object.keys(errors)).toEqual(['supply.volts']);
    expect(errors['supply.volts']).toMatch(message);
  });

  it('a comma decimal is read as a point and echoed', () => {
    const { spec, errors, echoes } = supplyVolts('3,2');
    expect(errors).toEqual({});
    expect(spec?.supply.volts).toBe(3.2);
    expect(echoes['supply.volts']).toBe('read as 3.2');
  });

  it('spaces between digit groups and a typographic minus are read, not refused', () => {
    expect(supplyVolts(' 24 ').spec?.supply.volts).toBe(24);
    const minus = supplyVolts('\u22125');
    expect(minus.errors['supply.volts']).toMatch(/greater than 0/);
  });

  it('kHz and µH are echoed in hertz and henries', () => {
    const { spec, echoes } = withForm((f) => ({ ...f, buck: { ...f.buck, switchingKilohertz: '300', inductorMicrohenries: '68' } }));
    expect(spec?.driver).toMatchObject({ switchingHz: 300_000, inductorHenries: 68e-6 });
    expect(echoes['buck.switchingKilohertz']).toBe('= 300\u202f000 Hz');
    expect(echoes['buck.inductorMicrohenries']).toBe('= 0.000068 H');
  });

  it('a frequency typed in hertz into the kHz field is refused with the number to type', () => {
    const { errors } = withForm((f) => ({ ...f, buck: { ...f.buck, switchingKilohertz: '300000', inductorMicrohenries: '68' } }));
    expect(errors['buck.switchingKilohertz']).toBe('Cannot be more than 10\u202f000 kHz. This field is in kHz: for 300 kHz, type 300');
  });

  it('an inductance typed in henries into the µH field is refused with the number to type', () => {
    const { errors } = withForm((f) => ({ ...f, buck: { ...f.buck, switchingKilohertz: '300', inductorMicrohenries: '0.000068' } }));
    expect(errors['buck.inductorMicrohenries']).toBe('Must be at least 0.1 µH. This field is in µH: for 68 µH, type 68');
  });

  it('limits on scaled fields are worded in the field’s unit', () => {
    const { errors } = withForm((f) => ({ ...f, buck: { ...f.buck, outputMilliamps: '200000' } }));
    expect(errors['buck.outputMilliamps']).toBe('Cannot be more than 100\u202f000 mA');
  });

  it('several bad fields are each marked, and the others keep no error', () => {
    const { errors } = withForm((f) => ({
      ...f,
      supply: { ...f.supply, volts: '1e308', maxAmps: 'abc' },
      string: { ...f.string, vfTyp: '' },
    }));
    expect(Object.keys(errors).sort()).toEqual(['string.vfTyp', 'supply.maxAmps', 'supply.volts']);
  });

  it('the thermal inputs reach the spec: heat sink, ambient, LED and linear-driver thermal specs', () => {
    const { spec, errors } = withForm((f) => ({
      ...f,
      driverType: 'linear',
      linear: { ...f.linear, sinkCPerW: '4', junctionToCaseCPerW: '3', maxJunctionC: '150' },
      string: { ...f.string, thermalOhmsJs: '6.5', maxJunctionC: '135' },
      heatSink: { on: true, count: '2', cPerW: '3,5' },
      ambient: { ambientC: '35' },
    }));
    expect(errors).toEqual({});
    expect(spec?.driver).toMatchObject({ sinkCPerW: 4, junctionToCaseCPerW: 3, maxJunctionC: 150 });
    expect(spec?.string.led).toMatchObject({ thermalOhmsJs: 6.5, maxJunctionC: 135 });
    expect(spec?.heatSink).toEqual({ count: 2, cPerW: 3.5 });
    expect(spec?.ambientC).toBe(35);
  });

  it('thermal bounds are the schema’s: a 300 °C junction, 2.5 sinks, a 0 °C/W sink, −40 °C ambient and 1e308 A are refused', () => {
    const { errors } = withForm((f) => ({
      ...f,
      string: { ...f.string, maxJunctionC: '300' },
      heatSink: { on: true, count: '2.5', cPerW: '0' },
      ambient: { ambientC: '-40' },
      buck: { ...f.buck, inductorSatAmps: '1e308' },
    }));
    expect(Object.keys(errors).sort()).toEqual(['ambient.ambientC', 'buck.inductorSatAmps', 'heatSink.cPerW', 'heatSink.count', 'string.maxJunctionC']);
  });

  it('a saved draft is restored over the defaults, keeping only known fields of the right type', () => {
    const draft = restoreForm({ supply: { volts: '1e308', evil: 'x', maxAmps: 3 }, driverType: 'linear', pwm: { on: true }, junk: { a: 1 } });
    expect(draft.supply).toEqual({ ...DEFAULT_FORM.supply, volts: '1e308' });
    expect(draft.driverType).toBe('linear');
    expect(draft.pwm.on).toBe(true);
    expect(restoreForm('nonsense')).toEqual(DEFAULT_FORM);
    expect(restoreForm({ driverType: 'boost' }).driverType).toBe('buck');
  });
});
