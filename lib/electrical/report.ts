import type { Check, Verdict } from './checks';

export type KitFigures = {
  stringVoltsMin: number;
  stringVoltsTyp: number;
  stringVoltsMax: number;
  /** The set current (for a resistor: the current at nominal supply and typical LEDs). */
  ledAmpsPeak: number;
  /** Peak × PWM duty. */
  ledAmpsAvg: number;
  /** Per LED: vfTyp × average current. */
  ledWatts: number;
  outputWatts: number;
  inputWatts: number;
  /** Average supply current: inputWatts / supply low end at the driver (linear, resistor: the string current). */
  supplyAmps: number;
  /** Heat in the driver or resistor; for linear and resistor drivers at the worst corner. */
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
};

export type KitReport = { verdict: Verdict; checks: Check[]; figures: KitFigures };

/** What one driver type contributes: its checks and figures. */
export type DriverPart = { checks: Check[]; figures: KitFigures };
