import { describe, expect, it } from 'vitest';
import { DEFAULT_FORM, type FormState, specFromForm } from '@/components/bench-check/form-state';
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
    expect(errors['buck.efficiencyPct']).toMatch(/percentage/);
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
