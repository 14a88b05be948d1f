// Thresholds that are rules of the trade rather than physics (tests mark them "common practice").
export const LED_POWER_CAUTION_FRACTION = 0.7; // heat-sink the LEDs above 70 % of their power rating
export const SUPPLY_CURRENT_CAUTION_FRACTION = 0.8; // keep a supply under 80 % of its rating
export const RESISTOR_DERATING_FRACTION = 0.5; // run a resistor at no more than half its rating
export const REGULATOR_HEAT_CAUTION_FRACTION = 0.7; // same heat rule as the LEDs for a rated linear driver
export const HEAT_SINK_WATTS = 1; // about a watt is where a part needs a heat sink
export const WIRE_DROP_CAUTION_FRACTION = 0.05; // lose no more than 5 % of the supply in the wire run
export const RIPPLE_CAUTION_FRACTION = 0.4; // inductor ripple up to 40 % of the output current
export const RESISTOR_SPREAD_CAUTION_FRACTION = 0.5; // low-corner current at least half the typical
export const WIRE_DROP_ADVICE_FRACTION = 0.05; // advise a thicker wire when more than 5 % of the supply is lost
export const SELV_DC_LIMIT_VOLTS = 60; // ripple-free DC extra-low voltage limit (IEC 61140, IEC 60598-1; from memory)
export const CCM_LIMIT_RIPPLE_FRACTION = 2; // ΔI ≥ 2 × I_out: the inductor current reaches zero (leaves continuous conduction)
export const WIRE_DENSITY_CAUTION_A_PER_MM2 = 4; // common practice (no source)
export const WIRE_DENSITY_FAIL_A_PER_MM2 = 10; // common practice (no source)
