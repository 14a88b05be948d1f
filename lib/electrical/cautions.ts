// Short safety notes shown beside every check. Calm and specific: what to do, not what to fear.
import { isAbove } from './checks';
import { formatAmps, formatCelsius, formatWatts } from './format';
import type { KitReport } from './report';
import type { KitSpec } from './schema';
import { sinkText } from './sharedChecks';
import { JUNCTION_CAUTION_MARGIN_C } from './thermal';
import { HEAT_SINK_WATTS, SELV_DC_LIMIT_VOLTS } from './thresholds';

export type Caution = {
  id: 'eyes' | 'led-heat' | 'driver-heat' | 'mains' | 'polarity' | 'fixed-wiring' | 'failed' | 'low-voltage' | 'pwm-peak';
  text: string;
};

/** LEDs rated from about half a watt up are bright enough to hurt eyes at close range. */
const HIGH_POWER_LED_WATTS = 0.5;
const DEFAULT_MAX_JUNCTION_C = 125;

export function safetyCautions(spec: KitSpec, report: KitReport): Caution[] {
  const out: Caution[] = [];
  const f = report.figures;
  const ledWattsWorst = f.ledWatts;
  const led = spec.string.led;
  const checkOf = (id: string) => report.checks.find((c) => c.id === id);

  if (report.verdict === 'fail')
    out.push({
      id: 'failed',
      text: 'Do not power this build until every failed check is fixed: a failed check can destroy a part at switch-on.',
    });
  const lv = checkOf('low-voltage-limit');
  if (lv && isAbove(lv.value, SELV_DC_LIMIT_VOLTS))
    out.push({
      id: 'low-voltage',
      text: `Above ${SELV_DC_LIMIT_VOLTS} V DC a shock can be dangerous: this build is outside the bench's low-voltage scope and belongs to someone qualified.`,
    });
  if (led.maxWatts >= HIGH_POWER_LED_WATTS || ledWattsWorst >= HIGH_POWER_LED_WATTS)
    out.push({
      id: 'eyes',
      text: 'High-power LEDs can damage eyes: do not look into them at full current. Point them at a wall or through a diffuser while testing.',
    });
  const maxJ = led.maxJunctionC ?? DEFAULT_MAX_JUNCTION_C;
  const hotJunction = isAbove(f.ledJunctionC, maxJ - JUNCTION_CAUTION_MARGIN_C);
  if (isAbove(ledWattsWorst, HEAT_SINK_WATTS) || hotJunction) {
    const sink =
      f.sinkCPerWNeeded !== undefined
        ? spec.heatSink
          ? ` Their junctions reach about ${formatCelsius(f.ledJunctionC)}; a sink of at most ${sinkText(f.sinkCPerWNeeded)} each keeps them ${JUNCTION_CAUTION_MARGIN_C} °C under their limit.`
          : ` Their junctions reach about ${formatCelsius(f.ledJunctionC)}; a heat sink of at most ${sinkText(f.sinkCPerWNeeded)} per LED keeps them ${JUNCTION_CAUTION_MARGIN_C} °C under their limit.`
        : ` Their junctions reach about ${formatCelsius(f.ledJunctionC)} and no heat sink brings them ${JUNCTION_CAUTION_MARGIN_C} °C under their limit: lower the current.`;
    out.push({
      id: 'led-heat',
      text: `Each LED turns up to ${formatWatts(ledWattsWorst)} into heat, and the heat must get from the junction through the board to the air.${sink} Keep fingers off the boards while they run.`,
    });
  }
  if (isAbove(f.lossWatts, HEAT_SINK_WATTS)) {
    const part = spec.driver.type === 'resistor' ? 'The series resistor' : 'The driver';
    const junction =
      f.regulatorJunctionC !== undefined ? ` Its junction reaches about ${formatCelsius(f.regulatorJunctionC)}.` : '';
    out.push({
      id: 'driver-heat',
      text: `${part} turns up to ${formatWatts(f.lossWatts)} into heat.${junction} Give it a heat sink with thermal paste or airflow, and keep fingers off while it runs.`,
    });
  }
  const duty = spec.pwmDuty ?? 1;
  if (duty < 1) {
    // Each PWM pulse draws the full current from the supply even though the average is lower.
    const pulse = f.supplyAmps / duty;
    if (isAbove(pulse, spec.supply.maxAmps))
      out.push({
        id: 'pwm-peak',
        text: `During each PWM pulse the supply gives about ${formatAmps(pulse)}, above its ${formatAmps(spec.supply.maxAmps)} rating, even though the average is lower: it may hit its current limit. Add a large capacitor at the driver or use a bigger supply.`,
      });
  }
  out.push(...generalCautions());
  return out;
}

/** The cautions that apply to every build, even one that could not be checked. */
export function generalCautions(): Caution[] {
  return [
    {
      id: 'mains',
      text: 'Feed the build from an enclosed, certified supply. Never open a mains supply or work on its mains side.',
    },
    {
      id: 'polarity',
      text: 'Check polarity on every connection, and set the current limit on a bench supply, before switching on.',
    },
    {
      id: 'fixed-wiring',
      text: "Anything fixed to a building's wiring falls under local electrical codes: have a licensed electrician connect it.",
    },
  ];
}
