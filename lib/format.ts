// Numbers carry units and sensible precision: V to 0.1, A to mA, W to 0.01.
export const volts = (v: number) => `${v.toFixed(1)} V`;
export const amps = (a: number) => (Math.abs(a) < 1 ? `${Math.round(a * 1000)} mA` : `${a.toFixed(3)} A`);
export const watts = (w: number) => `${w.toFixed(2)} W`;
export const percent = (p: number) => `${(p * 100).toFixed(0)} %`;

export function formatDateTime(d: Date | string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone }).format(new Date(d));
}
export function formatDate(d: Date | string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeZone }).format(new Date(d));
}

/** "1 overdue loan", "3 overdue loans". */
export const countOf = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
