// American Wire Gauge → copper resistance.
// Diameter: ASTM B258 defines gauge n by d = 0.127 mm × 92^((36 − n) / 39) (36 AWG = 0.005 in, 0000 = 0.46 in).
// Resistivity: IEC 60028 international annealed copper standard, 1/58 Ω·mm²/m at 20 °C.

export const ANNEALED_COPPER_OHM_MM2_PER_M = 1 / 58;

/** Bare conductor diameter in millimetres for a gauge (0000 is written −3, 00 is −1). */
export function awgDiameterMm(awg: number): number {
  return 0.127 * Math.pow(92, (36 - awg) / 39);
}

/** Cross-section in mm² of a solid conductor of that gauge. */
export function awgAreaMm2(awg: number): number {
  const d = awgDiameterMm(awg);
  return (Math.PI * d * d) / 4;
}

/** Resistance of one metre of annealed copper of that gauge, at 20 °C, in ohms. */
export function awgOhmsPerMeter(awg: number): number {
  return ANNEALED_COPPER_OHM_MM2_PER_M / awgAreaMm2(awg);
}

/** Out-and-back resistance of a two-wire run of `lengthMeters` one way. */
export function loopOhms(lengthMeters: number, awg: number): number {
  return 2 * lengthMeters * awgOhmsPerMeter(awg);
}
