// Builds the benchmark shelf in the database of DATABASE_URL: one invented space with 10,000 parts
// (drivers, supplies, LEDs, consumables, tools, meters, heat sinks, wire), 2,000 labelled units, 100 bins,
// a label code for each, counted stock, a steward and 60 members. Writes what the runner needs to a
// JSON file. Every name is generic and made up.
//   DATABASE_URL=… npx tsx bench/data.ts bench/out/fixture.json [--parts 10000]
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { sql } from 'kysely';
import { createDb } from '@/db/connect';
import type { PartCategory, Role } from '@/db/types';
import { encodeCode } from '@/labels/code';
import { LARGE_CODE_BASE } from './large-shape';
import { hashPassword } from '@/lib/auth/password';
import { seededRandom } from '@/lib/seeded-random';

const BENCH_PASSWORD = 'bench-password-1234';
export type Fixture = {
  spaceId: string;
  password: string;
  steward: string;
  members: { id: string; email: string }[];
  unitCodes: string[];
  borrowables: { partId: string; locationId: string }[];
  parts: number;
};

const out = process.argv[2] ?? 'bench/out/fixture.json';
const partsAt = process.argv.indexOf('--parts');
const PARTS = partsAt > 0 ? Number(process.argv[partsAt + 1]) : 10_000;
const MEMBERS = 60; // borrowers: at most 100 open loans each (the schema's ceiling), reset between bench phases
const BINS = 100;
const BORROWABLE = 200; // counted tools with deep stock: the borrow case takes one at a time
const UNITS_PER_PART = 4;
const BATCH = 1_000;

// Seeded: the same shelf every run.
const rand = seededRandom(0x5eed);
const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)];

const used = new Set<string>();
function code(): string {
  for (;;) {
    // Below the large shape's block (bench/large-shape.ts), so `--large` can add it beside this shelf.
    const c = encodeCode(Math.floor(rand() * LARGE_CODE_BASE));
    if (!used.has(c)) return used.add(c), c;
  }
}

type PartRow = { id: string; code: string; category: PartCategory; tracking: 'counted' | 'unit'; name: string; specs: Record<string, unknown>; sellable: boolean; price: number | null };

/** The mix of a makerspace electronics shelf, by position in the list. */
function makePart(i: number): PartRow {
  const id = crypto.randomUUID();
  const n = String(i).padStart(5, '0');
  const r = i % 20;
  const base = { id, code: code(), tracking: 'counted' as const, sellable: false, price: null };
  if (r < 3) {
    const amps = pick([0.35, 0.5, 0.7, 1.0, 1.5]);
    const maxIn = pick([24, 36, 48, 60]);
    return { ...base, category: 'driver', name: `Buck driver ${Math.round(amps * 1000)} mA, ${maxIn} V in #${n}`, specs: { type: 'buck', minInputVolts: 6, maxInputVolts: maxIn, outputAmps: amps } };
  }
  if (r < 6) {
    const volts = pick([5, 12, 19, 24, 36, 48]);
    return { ...base, category: 'supply', name: `Wall supply ${volts} V #${n}`, specs: { volts, tolerancePct: 5, maxAmps: pick([1, 2, 3, 5]), mains: true } };
  }
  if (r < 14) {
    const vf = pick([2.0, 2.9, 3.1, 3.3]);
    const amps = pick([0.02, 0.35, 0.7, 1.0]);
    return {
      ...base,
      category: 'led',
      name: `${pick(['Warm white', 'Cool white', 'Red', 'Amber', 'Deep blue'])} LED ${amps < 0.1 ? 'indicator' : 'star'} #${n}`,
      specs: { vfMin: +(vf * 0.92).toFixed(2), vfTyp: vf, vfMax: +(vf * 1.1).toFixed(2), maxAmps: amps, maxWatts: +(vf * amps * 1.2).toFixed(2) },
    };
  }
  if (r < 17) return { ...base, category: 'consumable', name: `${pick(['Solder wire', 'Heat-shrink pack', 'Flux pen', 'Terminal pack'])} #${n}`, specs: {}, sellable: true, price: 100 + (i % 900) };
  if (r === 17) return { ...base, category: 'heat_sink', name: `Finned heat sink ${pick([20, 40, 60])} mm #${n}`, specs: { celsiusPerWatt: pick([3, 6, 9]) } };
  if (r === 18) return { ...base, category: 'wire', name: `Hook-up wire ${pick([18, 20, 22, 24])} AWG #${n}`, specs: { awg: pick([18, 20, 22, 24]) } };
  return { ...base, category: i % 40 === 19 ? 'meter' : 'tool', tracking: 'unit', name: `${pick(['Bench multimeter', 'Crimp tool', 'Hot-air station', 'Wire stripper'])} #${n}`, specs: {} };
}

async function inBatches<T>(rows: T[], write: (batch: T[]) => Promise<unknown>) {
  for (let i = 0; i < rows.length; i += BATCH) await write(rows.slice(i, i + BATCH));
}

async function main() {
  const db = createDb(process.env.DATABASE_URL!, 2);
  const t0 = Date.now();
  try {
    const hash = await hashPassword(BENCH_PASSWORD);
    const tag = Date.now().toString(36); // a second shelf in the same database gets its own people
    const space = await db
      .insertInto('spaces')
      .values({ slug: `bench-hollow-${tag}`, name: 'Bench Hollow Workshop', currency: 'USD', time_zone: 'UTC', max_open_loans: 100 })
      .returning('id')
      .executeTakeFirstOrThrow();
    const spaceId = space.id;

    const people: { email: string; name: string; roles: Role[] }[] = [
      { email: `steward.${tag}@bench-hollow.invalid`, name: 'Bench steward', roles: ['steward'] },
      ...Array.from({ length: MEMBERS }, (_, i) => ({ email: `member${i}.${tag}@bench-hollow.invalid`, name: `Bench member ${i}`, roles: ['member'] as Role[] })),
    ];
    const users = await db
      .insertInto('users')
      .values(people.map((p) => ({ email: p.email, name: p.name, password_hash: hash, last_space_id: spaceId })))
      .returning(['id', 'email'])
      .execute();
    await db
      .insertInto('memberships')
      .values(users.map((u, i) => ({ space_id: spaceId, user_id: u.id, roles: people[i].roles })))
      .execute();

    const bins = Array.from({ length: BINS }, (_, i) => ({ id: crypto.randomUUID(), code: code(), name: `Bin ${String.fromCharCode(65 + (i % 10))}${String(i).padStart(2, '0')}` }));
    const parts = Array.from({ length: PARTS }, (_, i) => makePart(i));
    // The first BORROWABLE counted consumables become counted tools with deep stock, lent one at a time.
    const borrowables = parts.filter((p) => p.category === 'consumable').slice(0, BORROWABLE);
    for (const p of borrowables) Object.assign(p, { category: 'tool', sellable: false, price: null, name: p.name.replace(/^[^#]+/, 'Loaner hand tool ') });
    const units = parts
      .filter((p) => p.tracking === 'unit')
      .flatMap((p) => Array.from({ length: UNITS_PER_PART }, (_, k) => ({ id: crypto.randomUUID(), part: p, code: code(), serial: k % 2 ? `SN-${p.code}-${k}` : null })));

    await inBatches(
      [
        ...bins.map((b) => ({ code: b.code, space_id: spaceId, kind: 'location' as const, target_id: b.id })),
        ...parts.map((p) => ({ code: p.code, space_id: spaceId, kind: 'part' as const, target_id: p.id })),
        ...units.map((u) => ({ code: u.code, space_id: spaceId, kind: 'unit' as const, target_id: u.id })),
      ],
      (b) => db.insertInto('label_codes').values(b).execute(),
    );
    await db.insertInto('locations').values(bins.map((b) => ({ id: b.id, space_id: spaceId, code: b.code, name: b.name, kind: 'bin' as const }))).execute();
    await inBatches(parts, (b) =>
      db
        .insertInto('parts')
        .values(
          b.map((p, i) => ({
            id: p.id,
            space_id: spaceId,
            sku: `BH-${p.code}`,
            name: p.name,
            category: p.category,
            tracking: p.tracking,
            specs: JSON.stringify(p.specs),
            code: p.code,
            sellable: p.sellable,
            price_minor: p.price,
            reorder_point: i % 7 === 0 ? 20 : 0,
          })),
        )
        .execute(),
    );
    const binOf = new Map(parts.map((p, i) => [p.id, bins[i % BINS].id]));
    const deep = new Set(borrowables.map((p) => p.id));
    await inBatches(
      parts.filter((p) => p.tracking === 'counted'),
      (b) =>
        db
          .insertInto('stock')
          .values(b.map((p) => ({ space_id: spaceId, part_id: p.id, location_id: binOf.get(p.id)!, qty: deep.has(p.id) ? 1_000_000 : Math.floor(rand() * 200) })))
          .execute(),
    );
    await inBatches(units, (b) =>
      db
        .insertInto('units')
        .values(b.map((u) => ({ id: u.id, space_id: spaceId, part_id: u.part.id, code: u.code, serial: u.serial, location_id: binOf.get(u.part.id)! })))
        .execute(),
    );
    // Fresh statistics, so the planner sees 10,000 parts rather than an empty table.
    await sql`analyze`.execute(db);

    const fixture: Fixture = {
      spaceId,
      password: BENCH_PASSWORD,
      steward: people[0].email,
      members: users.slice(1).map((u) => ({ id: u.id, email: u.email })),
      unitCodes: units.filter((_, i) => i % 2 === 0).map((u) => u.code),
      borrowables: borrowables.map((p) => ({ partId: p.id, locationId: binOf.get(p.id)! })),
      parts: parts.length,
    };
    mkdirSync(path.dirname(out), { recursive: true });
    writeFileSync(out, JSON.stringify(fixture));
    console.log(
      `bench shelf: ${parts.length} parts, ${units.length} units, ${bins.length} bins, ${users.length} people in space ${spaceId} (${((Date.now() - t0) / 1000).toFixed(1)} s)`,
    );
  } finally {
    await db.destroy();
  }
}

main().catch((err) => {
  console.error('bench data failed:', err);
  process.exit(1);
});
