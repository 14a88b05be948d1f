// Short safety notes shown beside every check. Calm and specific: what to do, not what to fear.
import type { KitReport } from './report';
import { HEAT_SINK_WATTS } from './thresholds';
import { formatWatts } from './format';
import type { KitSpec } from './schema';

export type Caution = { id: 'eyes' | 'led-heat' | 'driver-heat' | 'mains' | 'polarity' | 'fixed-wiring' | 'failed'; text: string };

/** LEDs rated from about half a watt up are bright enough to hurt eyes at close range. */
const HIGH_POWER_LED_WATTS = 0.5;

export function safetyCautions(spec: KitSpec, report: KitReport): Caution[] {
  const out: Caution[] = [];
  const ledWattsWorst = report.checks.find((c) => c.id === 'led-power')?.value ?? report.figures.ledWatts;

  if (report.verdict === 'fail')
    out.push({
      id: 'failed',
      text: 'Do not power this build until every failed check is fixed: a failed check can destroy a part at switch-on.',
    });
  if (spec.string.led.maxWatts >= HIGH_POWER_LED_WATTS || ledWattsWorst >= HIGH_POWER_LED_WATTS)
    out.push({
      id: 'eyes',
      text: 'High-power LEDs can damage eyes: do not look into them at full current. Point them at a wall or through a diffuser while testing.',
    });
  if (ledWattsWorst > HEAT_SINK_WATTS)
    out.push({
      id: 'led-heat',
      text: `Each LED turns up to ${formatWatts(ledWattsWorst)} into heat. Above about 1 W per LED, mount them on a heat sink, and keep fingers off the boards while they run.`,
    });
  if (report.figures.lossWatts > HEAT_SINK_WATTS) {
    const part = spec.driver.type === 'resistor' ? 'The series resistor' : 'The driver';
    out.push({
      id: 'driver-heat',
      text: `${part} turns up to ${formatWatts(report.figures.lossWatts)} into heat. Give it a heat sink or airflow, and keep fingers off while it runs.`,
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
