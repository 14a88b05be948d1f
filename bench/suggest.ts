// "What works with this" on a generated 10,000-part shelf: the pruned ranking against the naive loop
// over every supply × driver pair, same run, same shelf. Run: npx tsx bench/suggest.ts
//   [--seed N] [--supplies N] [--drivers N] [--leds N] [--fast-runs N] [--naive-runs N]
// Target (shared notes, targets.md): < 100 ms for the ranked top 20 and ≥ 20 × faster than naive, with
// the same answers. The default mix (1,000 supplies, 1,000 drivers, 8,000 LEDs: a million pairs) keeps
// the naive baseline to seconds per run; more supplies and drivers only widen the gap.
import { loadavg } from 'node:os';
import { seededRandom } from '../lib/seeded-random';
import {
  type DriverSpec,
  type RankQuery,
  type ShelfDriver,
  type ShelfSupply,
  type StringSpec,
  rankCandidates,
  rankCandidatesNaive,
} from '@/lib/electrical';

const arg = (name: string, fallback: number) => {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? Number(process.argv[i + 1]) : fallback;
};
const SEED = arg('seed', 20_240_611);
const SUPPLIES = arg('supplies', 1_000);
const DRIVERS = arg('drivers', 1_000);
const LEDS = arg('leds', 8_000);
const FAST_RUNS = arg('fast-runs', 21);
const NAIVE_RUNS = arg('naive-runs', 3);

// Seeded: every run builds the same shelf.
const rand = seededRandom(SEED);
const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)];
const between = (lo: number, hi: number) => lo + rand() * (hi - lo);
const round = (x: number, step: number) => Math.round(x / step) * step;

function makeSupply(i: number): ShelfSupply {
  const volts = rand() < 0.8 ? pick([5, 9, 12, 15, 19, 20, 24, 28, 36, 48]) : round(between(3, 60), 0.1);
  return { id: `sup-${i}`, supply: { volts, tolerancePct: pick([1, 2, 3, 5, 10]), maxAmps: round(between(0.3, 10), 0.05) } };
}

function makeDriver(i: number): ShelfDriver {
  const r = rand();
  let driver: DriverSpec;
  if (r < 0.7) {
    driver = {
      type: 'buck',
      minInputVolts: pick([4.5, 6, 7, 8, 9]),
      maxInputVolts: pick([24, 30, 36, 40, 48, 60]),
      outputAmps: pick([0.15, 0.25, 0.3, 0.35, 0.5, 0.6, 0.7, 1.0, 1.2, 1.5]),
      headroomVolts: round(between(1, 2.5), 0.1),
      maxDuty: round(between(0.9, 0.98), 0.01),
      efficiency: round(between(0.85, 0.95), 0.01),
      ...(rand() < 0.5 ? { maxOutputVolts: pick([20, 30, 34, 40, 45, 55]) } : {}),
      ...(rand() < 0.5 ? { inductorHenries: pick([22e-6, 33e-6, 47e-6, 68e-6, 100e-6]), switchingHz: pick([200e3, 300e3, 500e3, 1e6]) } : {}),
    };
  } else if (r < 0.9) {
    driver = {
      type: 'linear',
      maxInputVolts: pick([12, 18, 24, 30, 40, 60]),
      outputAmps: pick([0.02, 0.05, 0.1, 0.15, 0.35, 0.5, 0.7, 1.0]),
      dropoutVolts: round(between(0.5, 2), 0.1),
      ...(rand() < 0.6 ? { maxWatts: pick([0.5, 1, 2, 3, 5]) } : {}),
    };
  } else {
    driver = { type: 'resistor', ohms: pick([10, 15, 22, 33, 47, 68, 100, 150, 220, 330, 470, 680, 1000]), watts: pick([0.25, 0.5, 1, 2, 5]) };
  }
  return { id: `drv-${i}`, driver };
}

type Led = StringSpec['led'];
function makeLed(): Led {
  const vfTyp = round(between(1.8, 3.6), 0.05);
  const maxAmps = pick([0.02, 0.03, 0.15, 0.35, 0.7, 1.0, 1.5, 3.0]);
  return {
    vfMin: round(vfTyp * between(0.88, 0.97), 0.01),
    vfTyp,
    vfMax: round(vfTyp * between(1.04, 1.15), 0.01),
    maxAmps,
    maxWatts: round(vfTyp * maxAmps * between(0.9, 1.3), 0.01),
  };
}

const supplies = Array.from({ length: SUPPLIES }, (_, i) => makeSupply(i));
const drivers = Array.from({ length: DRIVERS }, (_, i) => makeDriver(i));
const leds = Array.from({ length: LEDS }, () => makeLed());

// A few strings a member might bring, built from LEDs on the shelf.
const ledWith = (test: (l: Led) => boolean) => leds.find(test) ?? leds[0];
const strings: { name: string; string: StringSpec }[] = [
  { name: '6 × 3 W white', string: { count: 6, led: ledWith((l) => l.maxAmps === 0.7 && l.vfTyp >= 2.9) } },
  { name: '3 × 1 W red', string: { count: 3, led: ledWith((l) => l.maxAmps === 0.35 && l.vfTyp < 2.3) } },
  { name: '10 × 1 A white', string: { count: 10, led: ledWith((l) => l.maxAmps === 1.0 && l.vfTyp >= 3) } },
  { name: '4 × 20 mA indicator', string: { count: 4, led: ledWith((l) => l.maxAmps === 0.02) } },
];

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

function time<T>(runs: number, fn: () => T): { ms: number; result: T } {
  let result!: T;
  const t: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    result = fn();
    t.push(performance.now() - t0);
  }
  return { ms: median(t), result };
}

const same = (a: ReturnType<typeof rankCandidates>, b: ReturnType<typeof rankCandidates>) =>
  JSON.stringify(a.candidates.map((c) => [c.supplyId, c.driverId, c.verdict, c.margin])) ===
  JSON.stringify(b.candidates.map((c) => [c.supplyId, c.driverId, c.verdict, c.margin]));

console.log(
  `load average ${loadavg()[0].toFixed(1)} on this machine at start (figures are medians; a busy machine inflates all of them)`,
);
console.log(
  `shelf: ${SUPPLIES + DRIVERS + LEDS} parts (${SUPPLIES} supplies, ${DRIVERS} drivers, ${LEDS} LEDs), seed ${SEED}; ` +
    `${SUPPLIES * DRIVERS} supply × driver pairs; top 20; pruned median of ${FAST_RUNS}, naive median of ${NAIVE_RUNS}`,
);
// The first call on a shelf validates every record with the spec schemas; the parsed specs are then
// cached per record, so the timed runs below (pruned and naive alike) measure the search itself.
const validateMs = time(1, () => rankCandidates({ string: strings[0].string, supplies, drivers, limit: 20 })).ms;
console.log(`first call on this shelf, including validating its ${SUPPLIES + DRIVERS} supply and driver records: ${validateMs.toFixed(1)} ms`);
console.log('string                 | pruned ms | checked | naive ms | checked  | ratio  | same answers | ok / caution in top 20');
let allSame = true;
const ratios: number[] = [];
const prunedMs: number[] = [];
for (const { name, string } of strings) {
  const q: RankQuery = { string, supplies, drivers, limit: 20 };
  rankCandidates(q); // warm-up for this string
  const fast = time(FAST_RUNS, () => rankCandidates(q));
  const slow = time(NAIVE_RUNS, () => rankCandidatesNaive(q));
  const ok = same(fast.result, slow.result);
  allSame &&= ok;
  const ratio = slow.ms / fast.ms;
  ratios.push(ratio);
  prunedMs.push(fast.ms);
  const oks = fast.result.candidates.filter((c) => c.verdict === 'ok').length;
  console.log(
    `${name.padEnd(22)} | ${fast.ms.toFixed(1).padStart(9)} | ${String(fast.result.checked).padStart(7)} | ${slow.ms.toFixed(0).padStart(8)} | ${String(slow.result.checked).padStart(8)} | ${ratio.toFixed(0).padStart(5)}× | ${ok ? 'yes' : 'NO'.padEnd(3)}          | ${oks} / ${fast.result.candidates.length - oks}`,
  );
}
const worstMs = Math.max(...prunedMs);
const worstRatio = Math.min(...ratios);
console.log(
  `worst pruned ${worstMs.toFixed(1)} ms (target < 100 ms: ${worstMs < 100 ? 'met' : 'MISSED'}); ` +
    `lowest ratio ${worstRatio.toFixed(0)}× (target ≥ 20×: ${worstRatio >= 20 ? 'met' : 'MISSED'}); ` +
    `answers identical: ${allSame ? 'yes' : 'NO'}`,
);
if (!allSame) process.exitCode = 1;
