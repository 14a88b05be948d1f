import type { ChainRole, PartCategory } from '@/db/types';
import type { KitSpec } from '@/lib/electrical';

/** One line of a kit box, a loan or a basket of loose parts, with the part's stored specs. */
export type ChainLine = {
  role: ChainRole | null;
  category: PartCategory;
  name: string;
  qty: number;
  specs: Record<string, unknown>;
};

export type ChainParts = {
  supply: string;
  driver: string;
  led: string;
  ledCount: number;
  /** The sinks the LEDs are mounted on, e.g. "2 × Finned heat sink (4 °C/W each)"; absent without one. */
  heatSink?: string;
};

export type ChainResult = { ok: true; spec: KitSpec; parts: ChainParts } | { ok: false; missing: string[] };

/** What the chain is checked in: the space's air temperature. */
export type ChainSetting = { ambientC?: number };

const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);
const pick = <T extends object>(o: T) =>
  Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;

/**
 * Assembles the electrical chain (supply → driver → LED string, optional lead wire) from the exact
 * parts in a box or basket. A line's role comes from the kit template; loose parts fall back to
 * their category. The LED count is the quantity of the LED line: the string is wired in series.
 */
export function assembleChain(lines: ChainLine[], setting: ChainSetting = {}): ChainResult {
  const roleOf = (l: ChainLine): ChainRole | null =>
    l.role ?? (['supply', 'driver', 'led', 'wire'].includes(l.category) ? (l.category as ChainRole) : null);
  const find = (r: ChainRole) => lines.filter((l) => roleOf(l) === r);
  const supplies = find('supply');
  const drivers = find('driver');
  const leds = find('led');
  const wires = find('wire');
  const missing: string[] = [];
  if (supplies.length !== 1) missing.push(supplies.length ? 'exactly one supply (found several)' : 'a DC supply');
  if (drivers.length !== 1) missing.push(drivers.length ? 'exactly one driver (found several)' : 'an LED driver');
  if (leds.length !== 1) missing.push(leds.length ? 'one kind of LED for the string (found several)' : 'LEDs for the string');
  if (missing.length) return { ok: false, missing };

  const sink = heatSinkOf(lines.filter((x) => x.category === 'heat_sink'), leds[0].qty);
  const s = supplies[0].specs;
  const d = drivers[0].specs;
  const l = leds[0].specs;
  const driverType = (d.type as string) ?? 'buck';
  const driver =
    driverType === 'linear'
      ? pick({ type: 'linear' as const, maxInputVolts: num(d.maxInputVolts), outputAmps: num(d.outputAmps), dropoutVolts: num(d.dropoutVolts), maxWatts: num(d.maxWatts) })
      : driverType === 'resistor'
        ? pick({ type: 'resistor' as const, ohms: num(d.ohms), watts: num(d.watts) })
        : pick({
            type: 'buck' as const,
            minInputVolts: num(d.minInputVolts),
            maxInputVolts: num(d.maxInputVolts),
            outputAmps: num(d.outputAmps),
            headroomVolts: num(d.headroomVolts),
            maxDuty: num(d.maxDuty),
            efficiency: num(d.efficiency),
            maxOutputVolts: num(d.maxOutputVolts),
            inductorHenries: num(d.inductorHenries),
            switchingHz: num(d.switchingHz),
          });
  const spec = {
    supply: pick({ volts: num(s.volts), tolerancePct: num(s.tolerancePct), maxAmps: num(s.maxAmps) }),
    driver,
    string: {
      count: leds[0].qty,
      led: pick({
        vfMin: num(l.vfMin),
        vfTyp: num(l.vfTyp),
        vfMax: num(l.vfMax),
        maxAmps: num(l.maxAmps),
        maxWatts: num(l.maxWatts),
        thermalOhmsJs: num(l.thermalOhmsJs),
        maxJunctionC: num(l.maxJunctionC),
      }),
    },
    ...(sink ? { heatSink: sink.spec } : {}),
    ...(setting.ambientC !== undefined ? { ambientC: setting.ambientC } : {}),
    ...(wires.length === 1 && num(wires[0].specs.awg) !== undefined
      ? // Kit lead is twin cable sold by the metre: its length is the one-way run (the check doubles it).
        { wiring: { lengthMeters: wires[0].qty, awg: num(wires[0].specs.awg)! } }
      : {}),
  } as KitSpec;
  return {
    ok: true,
    spec,
    parts: {
      supply: supplies[0].name,
      driver: drivers[0].name,
      led: leds[0].name,
      ledCount: leds[0].qty,
      ...(sink ? { heatSink: sink.words } : {}),
    },
  };
}

/** The check's bound on the number of sinks. */
const MAX_SINKS = 50;

/**
 * The heat sinks the LEDs sit on, from the shelf's °C/W (sink to air). The check shares the LEDs evenly
 * over `count` equal sinks, so with sinks of different sizes the weakest one stands for all of them (an
 * upper bound on the temperature), and sinks beyond one per LED take no extra heat. A sink without a
 * stated thermal resistance cannot be counted on and is left out.
 */
export function heatSinkOf(
  sinks: Pick<ChainLine, 'name' | 'qty' | 'specs'>[],
  ledCount: number,
): { spec: { count: number; cPerW: number }; words: string } | null {
  const rated = sinks.filter((x) => num(x.specs.celsiusPerWatt) !== undefined && x.qty > 0);
  if (!rated.length) return null;
  const weakest = rated.reduce((a, b) => (num(b.specs.celsiusPerWatt)! > num(a.specs.celsiusPerWatt)! ? b : a));
  const cPerW = num(weakest.specs.celsiusPerWatt)!;
  const total = rated.reduce((n, x) => n + x.qty, 0);
  const count = Math.max(1, Math.min(total, Math.max(1, ledCount), MAX_SINKS));
  const words =
    rated.length === 1
      ? `${total} × ${weakest.name} (${cPerW} °C/W each)`
      : `${total} heat sinks, counted as the weakest (${weakest.name}, ${cPerW} °C/W)`;
  return { spec: { count, cPerW }, words };
}
