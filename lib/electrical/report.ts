import type { Check, Verdict } from './checks';

// Figures keep their version-1 names; where one had a typical value it now has the worst-case one.
export type KitFigures = {
  stringVoltsMin: number;
  stringVoltsTyp: number;
  stringVoltsMax: number;
  /** Highest current through an LED: set current + half the ripple (buck), set current (linear), I_max (resistor). */
  ledAmpsPeak: number;
  /** Set current × PWM duty (resistor: worst-corner current × PWM duty). */
  ledAmpsAvg: number;
  /** Per LED, worst case: vfMax × average current (resistor: the largest over the Vf spread). */
  ledWatts: number;
  /** String power at vfMax × average current. */
  outputWatts: number;
  inputWatts: number;
  /** Worst-case average supply current (supply's low end, worst-case LEDs). */
  supplyAmps: number;
  /** Heat in the driver or resistor at the worst corner. */
  lossWatts: number;
  efficiency: number;
  /** Buck: worst-case duty (string max at the supply's low end). */
  duty?: number;
  /** Buck with inductor and frequency: worst-case ripple, peak to peak, at the supply's high end. */
  rippleAmps?: number;
  /** Largest drop across the out-and-back wire run. */
  wireDropVolts?: number;
  /** Resistor: current at the worst corner (supply high, LEDs at vfMin). */
  resistorAmpsMax?: number;
  /** Worst-case LED junction temperature, °C. */
  ledJunctionC: number;
  /** Temperature of the kit's LED heat sink, °C (only with a heat sink). */
  sinkC?: number;
  /**
   * Largest sink → air resistance (°C/W, each sink) that keeps the LED junction 25 °C under its maximum
   * with the kit's sink count (one sink per LED when the kit has none); absent when no sink can.
   */
  sinkCPerWNeeded?: number;
  /** Linear driver: worst-case regulator junction temperature, °C. */
  regulatorJunctionC?: number;
};

export type KitReport = { verdict: Verdict; checks: Check[]; figures: KitFigures };

/** What one driver type contributes: its checks and figures. */
export type DriverPart = { checks: Check[]; figures: KitFigures };
