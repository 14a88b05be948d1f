// Fixed words and lists of the shelf, with no dependencies, so client components can import them
// without pulling in the validation library.
import type { PartCategory } from '@/db/types';

export const CATEGORIES = [
  'driver',
  'led',
  'supply',
  'heat_sink',
  'wire',
  'kit_box',
  'tool',
  'meter',
  'consumable',
  'other',
] as const satisfies readonly PartCategory[];

export const CATEGORY_WORDS: Record<PartCategory, string> = {
  driver: 'LED driver',
  led: 'LED',
  supply: 'DC supply',
  heat_sink: 'Heat sink',
  wire: 'Wire',
  kit_box: 'Kit box',
  tool: 'Tool',
  meter: 'Meter',
  consumable: 'Consumable',
  other: 'Other',
};

export const TRACKING = ['counted', 'unit'] as const;
export const LOCATION_KINDS = ['bin', 'shelf', 'drawer', 'cabinet', 'room'] as const;

export const PART_SORTS = ['name', 'sku', 'category', 'onHand', 'reorderPoint', 'updatedAt'] as const;
export type PartSort = (typeof PART_SORTS)[number];

/** The spec fields a category's form offers, in order, with their units (for forms, CSV and detail pages). */
export const SPEC_FIELDS: Partial<
  Record<
    PartCategory,
    {
      key: string;
      label: string;
      unit?: string;
      kind?: 'number' | 'text' | 'bool' | 'driverType';
      types?: string[];
    }[]
  >
> = {
  driver: [
    { key: 'type', label: 'Driver type', kind: 'driverType' },
    { key: 'minInputVolts', label: 'Minimum input', unit: 'V', types: ['buck'] },
    { key: 'maxInputVolts', label: 'Maximum input', unit: 'V', types: ['buck', 'linear'] },
    { key: 'outputAmps', label: 'Set current', unit: 'A', types: ['buck', 'linear'] },
    { key: 'headroomVolts', label: 'Headroom', unit: 'V', types: ['buck'] },
    { key: 'maxDuty', label: 'Maximum duty', unit: '0–1', types: ['buck'] },
    { key: 'efficiency', label: 'Efficiency', unit: '0–1', types: ['buck'] },
    { key: 'maxOutputVolts', label: 'Maximum output', unit: 'V', types: ['buck'] },
    { key: 'inductorHenries', label: 'Inductor', unit: 'H', types: ['buck'] },
    { key: 'switchingHz', label: 'Switching frequency', unit: 'Hz', types: ['buck'] },
    { key: 'dropoutVolts', label: 'Dropout', unit: 'V', types: ['linear'] },
    { key: 'maxWatts', label: 'Maximum dissipation', unit: 'W', types: ['linear'] },
    { key: 'ohms', label: 'Resistance', unit: 'Ω', types: ['resistor'] },
    { key: 'watts', label: 'Power rating', unit: 'W', types: ['resistor'] },
    { key: 'dimmable', label: 'PWM dimming input', kind: 'bool' },
  ],
  led: [
    { key: 'vfMin', label: 'Forward voltage, min', unit: 'V' },
    { key: 'vfTyp', label: 'Forward voltage, typ', unit: 'V' },
    { key: 'vfMax', label: 'Forward voltage, max', unit: 'V' },
    { key: 'atAmps', label: 'Stated at current', unit: 'A' },
    { key: 'maxAmps', label: 'Maximum current', unit: 'A' },
    { key: 'maxWatts', label: 'Maximum power', unit: 'W' },
    { key: 'thermalOhmsJs', label: 'Thermal resistance, junction to solder point', unit: '°C/W' },
    { key: 'maxJunctionC', label: 'Maximum junction temperature', unit: '°C' },
    { key: 'colour', label: 'Colour', kind: 'text' },
  ],
  supply: [
    { key: 'volts', label: 'Output', unit: 'V' },
    { key: 'tolerancePct', label: 'Tolerance', unit: '%' },
    { key: 'maxAmps', label: 'Maximum current', unit: 'A' },
    { key: 'mains', label: 'Mains powered', kind: 'bool' },
  ],
  wire: [
    { key: 'awg', label: 'Gauge', unit: 'AWG' },
    { key: 'colour', label: 'Colour', kind: 'text' },
  ],
  heat_sink: [
    { key: 'celsiusPerWatt', label: 'Thermal resistance', unit: '°C/W' },
    { key: 'lengthMm', label: 'Length', unit: 'mm' },
  ],
};
