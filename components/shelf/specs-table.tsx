import type { PartCategory } from '@/lib/domain';
import { SPEC_FIELDS } from '@/lib/inventory/words';

const DRIVER_TYPES: Record<string, string> = {
  buck: 'Buck (switching)',
  linear: 'Linear',
  resistor: 'Series resistor',
};

const PREFIXES: [number, string][] = [
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'µ'],
  [1e-9, 'n'],
];

/** Inductance and frequency read best with an SI prefix (68 µH, 400 kHz); other units as stored. */
function show(v: unknown, unit?: string): { value: string; unit?: string } {
  if (typeof v === 'boolean') return { value: v ? 'yes' : 'no' };
  if (typeof v === 'number' && (unit === 'H' || unit === 'Hz') && v !== 0) {
    const [scale, prefix] = PREFIXES.find(([p]) => Math.abs(v) >= p) ?? PREFIXES[PREFIXES.length - 1];
    return { value: String(Number((v / scale).toPrecision(4))), unit: `${prefix}${unit}` };
  }
  if (typeof v === 'number') return { value: String(Number(v.toPrecision(6))), unit };
  return { value: String(v), unit };
}

/** A part's specs with their labels and units; categories without a schema show their keys as written. */
export function SpecsTable({ category, specs }: { category: PartCategory; specs: Record<string, unknown> }) {
  const known = SPEC_FIELDS[category] ?? [];
  const rows: { key: string; label: string; value: string; unit?: string }[] = [
    ...known
      .filter((f) => specs[f.key] !== undefined)
      .map((f) => ({
        key: f.key,
        label: f.label,
        ...(f.kind === 'driverType'
          ? { value: DRIVER_TYPES[String(specs[f.key])] ?? String(specs[f.key]) }
          : show(specs[f.key], f.unit)),
      })),
    ...Object.entries(specs)
      .filter(([k]) => !known.some((f) => f.key === k))
      .map(([k, v]) => ({ key: k, label: k, ...show(v) })),
  ];
  if (!rows.length) return <p className="muted text-sm">No specs recorded.</p>;
  return (
    <table className="table-dense">
      <tbody>
        {rows.map((r) => (
          <tr key={r.key}>
            <th scope="row" className="font-normal">
              {r.label}
            </th>
            <td className="tabular-nums">
              {r.value}
              {r.unit && !r.unit.includes('–') ? ` ${r.unit}` : ''}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
