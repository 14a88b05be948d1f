import type { Measure, PartCategory } from '@/db/types';

// Generic part descriptions with believable specs; no brands, no manufacturer part numbers.
export type DemoPart = {
  sku: string;
  name: string;
  category: PartCategory;
  tracking: 'counted' | 'unit';
  specs: Record<string, unknown>;
  bin: 'drivers' | 'leds' | 'supplies' | 'consumables' | 'tools';
  qty?: number; // counted parts: stock in the bin, in the part's unit (metres and grams may be fractions)
  units?: number; // labelled parts: how many units
  priceMinor?: number; // sellable consumables: per item, per metre or per gram
  saleUnit?: Measure;
  reorder?: number;
};

const buck = (minIn: number, maxIn: number, amps: number, extra: Record<string, unknown> = {}) => ({
  type: 'buck', minInputVolts: minIn, maxInputVolts: maxIn, outputAmps: amps, headroomVolts: 1.5, efficiency: 0.9, maxDuty: 0.95, ...extra,
});
// Thermal figures are invented for the demo: junction to solder point (°C/W) and the hottest junction.
const led = (vfMin: number, vfTyp: number, vfMax: number, maxAmps: number, maxWatts: number, colour: string, thermalOhmsJs: number, maxJunctionC: number) => ({
  vfMin, vfTyp, vfMax, atAmps: maxAmps, maxAmps, maxWatts, thermalOhmsJs, maxJunctionC, colour,
});
const supply = (volts: number, maxAmps: number, mains = true) => ({ volts, tolerancePct: 5, maxAmps, mains });

export const DEMO_PARTS: DemoPart[] = [
  // Drivers (each board labelled)
  { sku: 'DRV-B350-36', name: 'Constant-current buck driver, 350 mA, 6–36 V in', category: 'driver', tracking: 'unit', bin: 'drivers', units: 4, specs: buck(6, 36, 0.35, { inductorHenries: 150e-6, switchingHz: 1e6 }) },
  { sku: 'DRV-B700-30', name: 'Constant-current buck driver, 700 mA, 7–30 V in', category: 'driver', tracking: 'unit', bin: 'drivers', units: 4, specs: buck(7, 30, 0.7, { inductorHenries: 68e-6, switchingHz: 1e6 }) },
  { sku: 'DRV-B1000-48', name: 'Constant-current buck driver, 1000 mA, 8–48 V in', category: 'driver', tracking: 'unit', bin: 'drivers', units: 3, specs: buck(8, 48, 1.0, { inductorHenries: 47e-6, switchingHz: 700e3 }) },
  { sku: 'DRV-B350-24D', name: 'Constant-current buck driver, 350 mA, 4.5–24 V in, PWM dimming input', category: 'driver', tracking: 'unit', bin: 'drivers', units: 3, specs: buck(4.5, 24, 0.35, { dimmable: true }) },
  { sku: 'DRV-B1500-40', name: 'Constant-current buck driver, 1500 mA, 10–40 V in', category: 'driver', tracking: 'unit', bin: 'drivers', units: 2, specs: buck(10, 40, 1.5) },
  { sku: 'DRV-B500-28', name: 'Constant-current buck driver, 500 mA, 5–28 V in', category: 'driver', tracking: 'unit', bin: 'drivers', units: 2, specs: buck(5, 28, 0.5) },
  { sku: 'DRV-L350-30', name: 'Linear constant-current driver, 350 mA, up to 30 V', category: 'driver', tracking: 'unit', bin: 'drivers', units: 3, specs: { type: 'linear', maxInputVolts: 30, outputAmps: 0.35, dropoutVolts: 1.2, maxWatts: 2.5 } },
  { sku: 'DRV-L700-24', name: 'Linear constant-current driver, 700 mA, up to 24 V', category: 'driver', tracking: 'unit', bin: 'drivers', units: 2, specs: { type: 'linear', maxInputVolts: 24, outputAmps: 0.7, dropoutVolts: 1.5, maxWatts: 4 } },
  { sku: 'RES-27R-3W', name: 'Series resistor, 27 Ω, 3 W, wirewound', category: 'driver', tracking: 'counted', bin: 'consumables', qty: 20, priceMinor: 45, reorder: 5, specs: { type: 'resistor', ohms: 27, watts: 3 } },
  { sku: 'RES-10R-2W', name: 'Series resistor, 10 Ω, 2 W, metal film', category: 'driver', tracking: 'counted', bin: 'consumables', qty: 30, priceMinor: 35, reorder: 5, specs: { type: 'resistor', ohms: 10, watts: 2 } },
  // LEDs on star boards (counted, in bags)
  { sku: 'LED-1W-CW', name: '1 W cool white LED on 20 mm star', category: 'led', tracking: 'counted', bin: 'leds', qty: 60, priceMinor: 90, reorder: 20, specs: led(2.8, 3.1, 3.5, 0.35, 1.2, 'cool white', 12, 125) },
  { sku: 'LED-3W-CW', name: '3 W cool white LED on 20 mm star', category: 'led', tracking: 'counted', bin: 'leds', qty: 48, priceMinor: 150, reorder: 24, specs: led(2.9, 3.2, 3.6, 0.7, 3, 'cool white', 9, 125) },
  { sku: 'LED-3W-WW', name: '3 W warm white LED on 20 mm star', category: 'led', tracking: 'counted', bin: 'leds', qty: 36, priceMinor: 150, reorder: 24, specs: led(2.9, 3.2, 3.6, 0.7, 3, 'warm white', 9, 125) },
  { sku: 'LED-3W-RD', name: '3 W red LED on 20 mm star', category: 'led', tracking: 'counted', bin: 'leds', qty: 30, priceMinor: 140, reorder: 12, specs: led(2.0, 2.3, 2.8, 1.0, 3, 'red', 10, 115) },
  { sku: 'LED-3W-GN', name: '3 W green LED on 20 mm star', category: 'led', tracking: 'counted', bin: 'leds', qty: 18, priceMinor: 160, reorder: 12, specs: led(3.0, 3.4, 3.8, 0.7, 3, 'green', 9, 125) },
  { sku: 'LED-3W-BL', name: '3 W royal blue LED on 20 mm star', category: 'led', tracking: 'counted', bin: 'leds', qty: 8, priceMinor: 160, reorder: 12, specs: led(3.0, 3.3, 3.7, 0.7, 3, 'royal blue', 9, 125) },
  { sku: 'LED-3W-AM', name: '3 W amber LED on 20 mm star', category: 'led', tracking: 'counted', bin: 'leds', qty: 14, priceMinor: 150, reorder: 6, specs: led(2.0, 2.3, 2.8, 0.7, 2, 'amber', 10, 115) },
  { sku: 'LED-5W-CW', name: '5 W cool white LED on 20 mm star', category: 'led', tracking: 'counted', bin: 'leds', qty: 24, priceMinor: 240, reorder: 8, specs: led(3.0, 3.3, 3.8, 1.5, 5, 'cool white', 6, 135) },
  { sku: 'LED-1W-DR', name: '1 W deep red LED on 20 mm star', category: 'led', tracking: 'counted', bin: 'leds', qty: 20, priceMinor: 110, reorder: 6, specs: led(1.8, 2.1, 2.5, 0.35, 0.9, 'deep red', 12, 115) },
  // Supplies (each labelled)
  { sku: 'PSU-12V-1.5A', name: '12 V 1.5 A wall supply', category: 'supply', tracking: 'unit', bin: 'supplies', units: 3, specs: supply(12, 1.5) },
  { sku: 'PSU-12V-3A', name: '12 V 3 A desk supply', category: 'supply', tracking: 'unit', bin: 'supplies', units: 2, specs: supply(12, 3) },
  { sku: 'PSU-19V-3.4A', name: '19 V 3.4 A desk supply', category: 'supply', tracking: 'unit', bin: 'supplies', units: 2, specs: supply(19, 3.4) },
  { sku: 'PSU-24V-1A', name: '24 V 1 A wall supply', category: 'supply', tracking: 'unit', bin: 'supplies', units: 3, specs: supply(24, 1) },
  { sku: 'PSU-24V-2A', name: '24 V 2 A wall supply', category: 'supply', tracking: 'unit', bin: 'supplies', units: 4, specs: supply(24, 2) },
  { sku: 'PSU-36V-2A', name: '36 V 2 A desk supply', category: 'supply', tracking: 'unit', bin: 'supplies', units: 2, specs: supply(36, 2) },
  { sku: 'PSU-48V-1.5A', name: '48 V 1.5 A desk supply', category: 'supply', tracking: 'unit', bin: 'supplies', units: 2, specs: supply(48, 1.5) },
  { sku: 'PSU-9V-1A', name: '9 V 1 A wall supply', category: 'supply', tracking: 'unit', bin: 'supplies', units: 2, specs: supply(9, 1) },
  { sku: 'PSU-5V-2A', name: '5 V 2 A USB wall supply', category: 'supply', tracking: 'unit', bin: 'supplies', units: 2, specs: supply(5, 2) },
  // Heat sinks and wire
  { sku: 'HS-BAR-200', name: 'Aluminium heat-sink bar, 200 mm, takes six stars', category: 'heat_sink', tracking: 'counted', bin: 'consumables', qty: 10, priceMinor: 650, reorder: 3, specs: { celsiusPerWatt: 2.5, lengthMm: 200 } },
  { sku: 'HS-RND-40', name: 'Round finned heat sink, 40 mm, one star', category: 'heat_sink', tracking: 'counted', bin: 'consumables', qty: 25, priceMinor: 180, reorder: 8, specs: { celsiusPerWatt: 9, lengthMm: 40 } },
  { sku: 'HS-FIN-60', name: 'Finned heat sink, 60 × 60 mm', category: 'heat_sink', tracking: 'counted', bin: 'consumables', qty: 6, priceMinor: 320, reorder: 2, specs: { celsiusPerWatt: 4, lengthMm: 60 } },
  { sku: 'WIRE-TWIN-22', name: 'Red/black twin lead, 22 AWG (per metre)', category: 'wire', tracking: 'counted', bin: 'consumables', qty: 65.5, priceMinor: 160, saleUnit: 'metre', reorder: 20, specs: { awg: 22, colour: 'red/black' } },
  { sku: 'WIRE-SIL-18R', name: 'Silicone hook-up wire, 18 AWG, red (per metre)', category: 'wire', tracking: 'counted', bin: 'consumables', qty: 37.5, priceMinor: 80, saleUnit: 'metre', reorder: 10, specs: { awg: 18, colour: 'red' } },
  { sku: 'WIRE-SIL-18B', name: 'Silicone hook-up wire, 18 AWG, black (per metre)', category: 'wire', tracking: 'counted', bin: 'consumables', qty: 40, priceMinor: 80, saleUnit: 'metre', reorder: 10, specs: { awg: 18, colour: 'black' } },
  { sku: 'WIRE-SOL-24', name: 'Solid-core hook-up wire, 24 AWG (per metre)', category: 'wire', tracking: 'counted', bin: 'consumables', qty: 100, priceMinor: 20, saleUnit: 'metre', reorder: 25, specs: { awg: 24 } },
  // Consumables
  { sku: 'CON-HSHRINK', name: 'Heat-shrink tubing assortment, 2:1', category: 'consumable', tracking: 'counted', bin: 'consumables', qty: 15, priceMinor: 300, reorder: 5, specs: {} },
  { sku: 'CON-TPAD', name: 'Thermal adhesive pad for 20 mm star', category: 'consumable', tracking: 'counted', bin: 'consumables', qty: 120, priceMinor: 25, reorder: 40, specs: {} },
  { sku: 'CON-TPASTE', name: 'Thermal paste sachet, 1 g', category: 'consumable', tracking: 'counted', bin: 'consumables', qty: 2, priceMinor: 75, reorder: 10, specs: {} },
  { sku: 'CON-SOLDER', name: 'Lead-free solder wire, 0.7 mm, off the spool (by the gram)', category: 'consumable', tracking: 'counted', bin: 'consumables', qty: 420, priceMinor: 14, saleUnit: 'gram', reorder: 150, specs: {} },
  { sku: 'CON-M3', name: 'M3 × 8 mm screws with nuts, bag of 20', category: 'consumable', tracking: 'counted', bin: 'consumables', qty: 22, priceMinor: 120, reorder: 5, specs: {} },
  { sku: 'CON-TERM2', name: '2-way screw terminal block, 5 mm pitch', category: 'consumable', tracking: 'counted', bin: 'consumables', qty: 60, priceMinor: 30, reorder: 20, specs: {} },
  { sku: 'CON-JACK', name: 'Panel DC barrel socket, 5.5 × 2.1 mm', category: 'consumable', tracking: 'counted', bin: 'consumables', qty: 30, priceMinor: 85, reorder: 10, specs: {} },
  { sku: 'CON-LEVER2', name: 'Lever wire connector, 2-way', category: 'consumable', tracking: 'counted', bin: 'consumables', qty: 50, priceMinor: 40, reorder: 15, specs: {} },
  { sku: 'CON-FUSE1A', name: 'Inline fuse holder with 1 A fuse', category: 'consumable', tracking: 'counted', bin: 'consumables', qty: 12, priceMinor: 140, reorder: 4, specs: {} },
  { sku: 'CON-LENS30', name: 'Collimator lens, 30°, for 20 mm star', category: 'consumable', tracking: 'counted', bin: 'consumables', qty: 4, priceMinor: 95, reorder: 8, specs: {} },
  { sku: 'CON-TIES', name: 'Cable ties, 100 mm, bag of 50', category: 'consumable', tracking: 'counted', bin: 'consumables', qty: 9, priceMinor: 150, reorder: 3, specs: {} },
  // Tools and meters (labelled)
  { sku: 'TOOL-DMM', name: 'Digital multimeter, auto-ranging', category: 'meter', tracking: 'unit', bin: 'tools', units: 3, specs: { maxVolts: 600, category: 'CAT II' } },
  { sku: 'TOOL-IRON', name: 'Temperature-controlled soldering iron', category: 'tool', tracking: 'unit', bin: 'tools', units: 2, specs: { watts: 60 } },
  { sku: 'TOOL-BENCHPSU', name: 'Bench supply, 0–30 V, 0–3 A, current limit', category: 'tool', tracking: 'unit', bin: 'tools', units: 1, specs: { maxVolts: 30, maxAmps: 3 } },
  { sku: 'KIT-BOX-S', name: 'Kit box, small, with foam insert', category: 'kit_box', tracking: 'counted', bin: 'tools', qty: 6, reorder: 2, specs: {} },
];

/** The smaller shelf of the teaching lab: a subset of the same kinds of part. */
export const FERNWICK_SKUS = [
  'DRV-B350-36', 'DRV-B700-30', 'DRV-L350-30', 'LED-1W-CW', 'LED-3W-CW', 'LED-3W-RD', 'PSU-12V-1.5A', 'PSU-24V-1A',
  'PSU-24V-2A', 'HS-BAR-200', 'HS-RND-40', 'WIRE-TWIN-22', 'CON-TPAD', 'CON-SOLDER', 'CON-HSHRINK', 'CON-TERM2', 'TOOL-DMM', 'TOOL-IRON',
  'RES-27R-3W', 'KIT-BOX-S',
];
