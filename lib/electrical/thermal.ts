// Heat to the junction: a series chain of thermal resistances from the hot part to the air, with all the
// electrical power counted as heat (an upper bound: part of an LED's power leaves as light).
// ΔT = P × Σ R_th, the thermal analogue of Ohm's law. The resistances we assume where the spec gives
// none are from memory (README.md in this folder): see the constants.
import type { ResolvedHeatSink } from './schema';

/** LED star board and its pad to the sink, °C/W per LED (from memory). */
export const LED_BOARD_C_PER_W = 2;
/** A bare 20 mm star board in still air, °C/W (from memory). */
export const BARE_STAR_C_PER_W = 40;
/** Thermal interface between a TO-220-class tab and its sink, °C/W (from memory). */
export const REGULATOR_INTERFACE_C_PER_W = 0.5;
/** A TO-220-class package in free air, junction → ambient, °C/W (from memory). */
export const REGULATOR_FREE_AIR_C_PER_W = 62.5;
/** A junction within this many °C of its maximum is a caution (common practice, no source). */
export const JUNCTION_CAUTION_MARGIN_C = 25;

export type LedThermal = {
  junctionC: number;
  /** With a sink: the sink's temperature. */
  sinkC?: number;
  /** Largest cPerW per sink that keeps the junction at or under max − 25 °C; undefined when none can. */
  sinkCPerWNeeded?: number;
};

/**
 * LED junction temperature for `count` LEDs each dissipating `heatWatts`, on `sink` (shared evenly) or
 * on bare boards in still air.
 */
export function ledThermal(
  heatWatts: number,
  count: number,
  led: { thermalOhmsJs: number; maxJunctionC: number },
  ambientC: number,
  sink: ResolvedHeatSink | undefined,
): LedThermal {
  const toBoard = heatWatts * (led.thermalOhmsJs + LED_BOARD_C_PER_W);
  // Without a sink, the advice is for one sink per LED.
  const sinks = sink ? sink.count : count;
  const wattsPerSink = (count * heatWatts) / sinks;
  const room = led.maxJunctionC - JUNCTION_CAUTION_MARGIN_C - ambientC - toBoard;
  const needed = room > 0 ? Math.min(room / wattsPerSink, Number.MAX_VALUE) : undefined;
  const out: LedThermal = sink
    ? (() => {
        const sinkC = ambientC + wattsPerSink * sink.cPerW;
        return { junctionC: sinkC + toBoard, sinkC };
      })()
    : { junctionC: ambientC + heatWatts * (led.thermalOhmsJs + LED_BOARD_C_PER_W + BARE_STAR_C_PER_W) };
  if (needed !== undefined) out.sinkCPerWNeeded = needed;
  return out;
}

/** Linear regulator junction: through its case, the interface and its sink, or in free air. */
export function regulatorJunctionC(
  lossWatts: number,
  ambientC: number,
  d: { sinkCPerW?: number; junctionToCaseCPerW: number },
): number {
  const path =
    d.sinkCPerW !== undefined ? d.junctionToCaseCPerW + REGULATOR_INTERFACE_C_PER_W + d.sinkCPerW : REGULATOR_FREE_AIR_C_PER_W;
  return ambientC + lossWatts * path;
}
