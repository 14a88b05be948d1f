// The large shape: many spaces, each with a full shelf, and a long history of loans — written by a
// handful of set-based statements (INSERT … SELECT over generate_series), never row by row, so a million
// loans take seconds. Used by the EXPLAIN test (tests/integration/plans-large.test.ts, on its own
// database) and by `npm run bench -- --large` (beside the bench shelf).
//
// Ids are derived from a name (md5 shaped as a version-4 UUID), so every statement can compute the id
// of a row another statement wrote without reading it back. Label codes are real codes (Crockford
// Base32 with its check symbol, labels/code.ts) numbered from 2^29 up; bench/data.ts draws its random
// codes below 2^29, so the two never collide.
import { sql, type Kysely } from 'kysely';
import type { Database } from '@/db/types';

export type LargeShape = {
  spaces: number;
  partsPerSpace: number;
  /** Past (returned) loans over all spaces, one line each. */
  pastLoans: number;
  membersPerSpace: number;
  /** Loans still out per space: most due later, `overduePerSpace` of them already overdue. */
  openPerSpace: number;
  overduePerSpace: number;
  /** Spaces 1..overdueSpaces carry the overdue loans (few, so the reminder round stays short). */
  overdueSpaces: number;
};

export const LARGE: LargeShape = {
  spaces: 50,
  partsPerSpace: 10_000,
  pastLoans: 1_000_000,
  membersPerSpace: 20,
  openPerSpace: 40,
  overduePerSpace: 1,
  overdueSpaces: 5,
};

const BINS = 100;
const UNITS_PER_UNIT_PART = 4;
/** Codes of the large shape start here (bench/data.ts stays below). */
export const LARGE_CODE_BASE = 2 ** 29;

/** Deterministic ids and codes of the large shape, for callers that pick rows to work on. */
const KIND = { space: 1, member: 2, part: 3, bin: 4, unit: 5, pastLoan: 6, openLoan: 7 } as const;
const hex = (n: number, width: number) => n.toString(16).padStart(width, '0');
const lid = (k: number, s: number, n: number) => `${hex(k, 8)}-${hex(s, 4)}-4000-8000-${hex(n, 12)}`;
export const largeIds = {
  space: (s: number) => lid(KIND.space, s, 0),
  member: (s: number, m: number) => lid(KIND.member, s, m),
  part: (s: number, p: number) => lid(KIND.part, s, p),
  bin: (s: number, b: number) => lid(KIND.bin, s, b),
  unit: (s: number, p: number, k: number) => lid(KIND.unit, s, p * UNITS_PER_UNIT_PART + k),
};

/** Part p of a space is labelled-unit tracked when p % 20 === 19 (tools and meters), else counted. */
export const isUnitPart = (p: number) => p % 20 === 19;
export const binOf = (p: number) => p % BINS;
/** Code numbers: per space a block of 2^16 (parts, then units, then bins). */
const codeNo = (s: string, local: string) => `(${LARGE_CODE_BASE} + (${s}) * 65536 + (${local}))`;

const BULK_TABLES = ['label_codes', 'parts', 'stock', 'units', 'loans', 'loan_lines'];

/**
 * Drops the indexes, primary keys and unique constraints of `tables` (foreign keys pointing at them are
 * dropped first and come back last) and returns the statements that put everything back as it was.
 */
async function dropIndexes(c: Kysely<Database>, tables: string[]): Promise<string[]> {
  const { rows: fks } = await sql<{ tbl: string; name: string; def: string }>`
    select conrelid::regclass::text as tbl, conname as name, pg_get_constraintdef(oid) as def from pg_constraint
     where contype = 'f' and confrelid::regclass::text = any(${tables})`.execute(c);
  const { rows: keys } = await sql<{ tbl: string; name: string; def: string }>`
    select conrelid::regclass::text as tbl, conname as name, pg_get_constraintdef(oid) as def from pg_constraint
     where contype in ('p', 'u') and conrelid::regclass::text = any(${tables})`.execute(c);
  const { rows: plain } = await sql<{ name: string; def: string }>`
    select i.indexrelid::regclass::text as name, pg_get_indexdef(i.indexrelid) as def from pg_index i
     where i.indrelid::regclass::text = any(${tables})
       and not exists (select 1 from pg_constraint k where k.conindid = i.indexrelid and k.contype in ('p', 'u'))`.execute(c);
  for (const f of fks) await sql.raw(`alter table ${f.tbl} drop constraint ${f.name}`).execute(c);
  for (const k of keys) await sql.raw(`alter table ${k.tbl} drop constraint ${k.name}`).execute(c);
  for (const i of plain) await sql.raw(`drop index ${i.name}`).execute(c);
  return [
    ...keys.map((k) => `alter table ${k.tbl} add constraint ${k.name} ${k.def}`),
    ...plain.map((i) => i.def),
    // Checked again as they come back: one join per key, not a trigger per row.
    ...fks.map((f) => `alter table ${f.tbl} add constraint ${f.name} ${f.def}`),
  ];
}

/** Writes the shape into `db` (a database migrated to the latest schema, without this shape yet). */
export async function generateLargeShape(
  db: Kysely<Database>,
  shape: LargeShape,
  passwordHash: string,
  log: (line: string) => void = () => {},
): Promise<void> {
  const P = shape.partsPerSpace;
  if (P > 10_000 || shape.spaces > 8_000) throw new RangeError('the code blocks hold at most 10,000 parts per space');
  // One connection: the helper functions live in this session's pg_temp schema.
  await db.connection().execute(async (c) => {
    const run = async (what: string, q: ReturnType<typeof sql>) => {
      const t = Date.now();
      const r = await q.execute(c);
      log(`${what}: ${r.numAffectedRows ?? ''} rows, ${((Date.now() - t) / 1000).toFixed(1)} s`);
    };
    // (kind, space, n) → a version-4-shaped UUID (zod's uuid() accepts it); a number → a label code.
    // Plain expressions (no FROM), so PostgreSQL inlines them instead of calling a function per row.
    await sql`create or replace function pg_temp.lid(k int, s int, n bigint) returns uuid language sql immutable as
      $$ select (lpad(to_hex(k), 8, '0') || '-' || lpad(to_hex(s), 4, '0') || '-4000-8000-' || lpad(to_hex(n), 12, '0'))::uuid $$`.execute(c);
    await sql`create or replace function pg_temp.code(n bigint) returns text language sql immutable as $$
      select substr('0123456789ABCDEFGHJKMNPQRSTVWXYZ', ((n >> 25) & 31)::int + 1, 1) ||
             substr('0123456789ABCDEFGHJKMNPQRSTVWXYZ', ((n >> 20) & 31)::int + 1, 1) ||
             substr('0123456789ABCDEFGHJKMNPQRSTVWXYZ', ((n >> 15) & 31)::int + 1, 1) ||
             substr('0123456789ABCDEFGHJKMNPQRSTVWXYZ', ((n >> 10) & 31)::int + 1, 1) ||
             substr('0123456789ABCDEFGHJKMNPQRSTVWXYZ', ((n >> 5) & 31)::int + 1, 1) ||
             substr('0123456789ABCDEFGHJKMNPQRSTVWXYZ', (n & 31)::int + 1, 1) ||
             substr('0123456789ABCDEFGHJKMNPQRSTVWXYZ*~$=U', (n % 37)::int + 1, 1) $$`.execute(c);
    // Bulk load of consistent-by-construction rows: foreign keys are checked by the statements'
    // construction, not row by row (the session's replication role skips the FK triggers; superuser).
    await sql`set session_replication_role = replica`.execute(c);
    await sql`set synchronous_commit = off`.execute(c);
    await sql`set maintenance_work_mem = '256MB'`.execute(c);
    // Indexes of the big tables are built once after the load (a sort) rather than grown row by row.
    const rebuild = await dropIndexes(c, BULK_TABLES);
    log(`dropped ${rebuild.length} indexes and keys of ${BULK_TABLES.join(', ')}`);
    try {
      const S = shape.spaces;
      const M = shape.membersPerSpace;
      await run(
        'spaces',
        sql`insert into spaces (id, slug, name, time_zone, max_open_loans)
            select pg_temp.lid(1, s, 0), 'large-' || s, 'Large test space ' || s, 'UTC', 100
              from generate_series(1, ${S}::int) s`,
      );
      await run(
        'users',
        sql`insert into users (id, email, name, password_hash, last_space_id)
            select pg_temp.lid(2, s, m), 'member' || m || '.space' || s || '@large.invalid',
                   'Large member ' || s || '/' || m, ${passwordHash}, pg_temp.lid(1, s, 0)
              from generate_series(1, ${S}::int) s, generate_series(0, ${M - 1}::int) m`,
      );
      await run(
        'memberships',
        sql`insert into memberships (space_id, user_id, roles)
            select pg_temp.lid(1, s, 0), pg_temp.lid(2, s, m),
                   case when m = 0 then array['steward']::text[] else array['member']::text[] end
              from generate_series(1, ${S}::int) s, generate_series(0, ${M - 1}::int) m`,
      );
      // Label codes: parts at 0.., units at 10,000.., bins at 60,000.. of each space's block.
      await run(
        'label codes',
        sql`insert into label_codes (code, space_id, kind, target_id)
            select pg_temp.code(${sql.raw(codeNo('s', 'p'))}), pg_temp.lid(1, s, 0), 'part', pg_temp.lid(3, s, p)
              from generate_series(1, ${S}::int) s, generate_series(0, ${P - 1}::int) p
            union all
            select pg_temp.code(${sql.raw(codeNo('s', `10000 + (p / 20) * ${UNITS_PER_UNIT_PART} + k`))}), pg_temp.lid(1, s, 0), 'unit',
                   pg_temp.lid(5, s, p * ${UNITS_PER_UNIT_PART} + k)
              from generate_series(1, ${S}::int) s, generate_series(19, ${P - 1}::int, 20) p, generate_series(0, ${UNITS_PER_UNIT_PART - 1}::int) k
            union all
            select pg_temp.code(${sql.raw(codeNo('s', '60000 + b'))}), pg_temp.lid(1, s, 0), 'location', pg_temp.lid(4, s, b)
              from generate_series(1, ${S}::int) s, generate_series(0, ${BINS - 1}::int) b`,
      );
      await run(
        'bins',
        sql`insert into locations (id, space_id, code, name, kind)
            select pg_temp.lid(4, s, b), pg_temp.lid(1, s, 0), pg_temp.code(${sql.raw(codeNo('s', '60000 + b'))}),
                   'Bin ' || b, 'bin'
              from generate_series(1, ${S}::int) s, generate_series(0, ${BINS - 1}::int) b`,
      );
      // The mix of bench/data.ts by p % 20: drivers, supplies, LEDs, consumables, heat sinks, wire, tools.
      await run(
        'parts',
        sql`insert into parts (id, space_id, sku, name, category, tracking, specs, code, sellable, price_minor, reorder_point, updated_at)
            select pg_temp.lid(3, s, p), pg_temp.lid(1, s, 0), 'LG-' || s || '-' || p,
                   case c when 'driver' then 'Buck driver ' || (350 + (p % 4) * 350) || ' mA #' || p
                          when 'supply' then 'Wall supply ' || (12 + (p % 3) * 12) || ' V #' || p
                          when 'led' then (array['Warm white', 'Cool white', 'Red', 'Amber'])[1 + p % 4] || ' LED star #' || p
                          when 'consumable' then 'Solder wire pack #' || p
                          when 'heat_sink' then 'Finned heat sink #' || p
                          when 'wire' then 'Hook-up wire 22 AWG #' || p
                          else 'Bench multimeter #' || p end,
                   c, case when c in ('tool', 'meter') then 'unit' else 'counted' end,
                   case c when 'driver' then jsonb_build_object('type', 'buck', 'minInputVolts', 6, 'maxInputVolts', 48, 'outputAmps', 0.35 * (1 + p % 4))
                          when 'supply' then jsonb_build_object('volts', 12 + (p % 3) * 12, 'tolerancePct', 5, 'maxAmps', 2, 'mains', true)
                          when 'led' then jsonb_build_object('vfMin', 2.7, 'vfTyp', 2.9, 'vfMax', 3.2, 'maxAmps', 0.7, 'maxWatts', 2.4)
                          when 'heat_sink' then jsonb_build_object('celsiusPerWatt', 6)
                          when 'wire' then jsonb_build_object('awg', 22)
                          else '{}'::jsonb end,
                   pg_temp.code(${sql.raw(codeNo('s', 'p'))}), c = 'consumable', case when c = 'consumable' then 100 + p % 900 end,
                   case when p % 7 = 0 then 20 else 0 end, now() - make_interval(mins => p)
              from generate_series(1, ${S}::int) s, generate_series(0, ${P - 1}::int) p,
                   lateral (select case when p % 20 < 3 then 'driver' when p % 20 < 6 then 'supply' when p % 20 < 14 then 'led'
                                        when p % 20 < 17 then 'consumable' when p % 20 = 17 then 'heat_sink' when p % 20 = 18 then 'wire'
                                        when p % 40 = 19 then 'meter' else 'tool' end as c) k`,
      );
      await run(
        'stock',
        sql`insert into stock (space_id, part_id, location_id, qty)
            select pg_temp.lid(1, s, 0), pg_temp.lid(3, s, p), pg_temp.lid(4, s, p % ${BINS}),
                   case when p % 20 between 14 and 16 then 100000 else (p * 7919) % 200 end
              from generate_series(1, ${S}::int) s, generate_series(0, ${P - 1}::int) p where p % 20 <> 19`,
      );
      await run(
        'units',
        sql`insert into units (id, space_id, part_id, code, serial, location_id)
            select pg_temp.lid(5, s, p * ${UNITS_PER_UNIT_PART} + k), pg_temp.lid(1, s, 0), pg_temp.lid(3, s, p),
                   pg_temp.code(${sql.raw(codeNo('s', `10000 + (p / 20) * ${UNITS_PER_UNIT_PART} + k`))}), 'SN-' || s || '-' || p || '-' || k,
                   pg_temp.lid(4, s, p % ${BINS})
              from generate_series(1, ${S}::int) s, generate_series(19, ${P - 1}::int, 20) p, generate_series(0, ${UNITS_PER_UNIT_PART - 1}::int) k`,
      );
      // Past loans: returned, spread over three years, one counted line each; loan g belongs to space
      // 1 + g % S, borrower (g / S) % M, part (g * 7919) % P moved off the unit-tracked ones.
      const part = sql.raw(`((((g::bigint * 7919) % ${P}) - case when ((g::bigint * 7919) % ${P}) % 20 = 19 then 1 else 0 end))::int`);
      const space = sql.raw(`(1 + g % ${S})`);
      await run(
        'past loans',
        sql`insert into loans (id, space_id, borrower_id, lent_by_id, status, out_at, due_at, returned_at, check_verdict, created_at)
            select pg_temp.lid(6, ${space}, g), pg_temp.lid(1, ${space}, 0), pg_temp.lid(2, ${space}, (g / ${S}::int) % ${M}::int),
                   pg_temp.lid(2, ${space}, 0), 'returned', t, t + interval '14 days', t + make_interval(days => (g % 20)::int),
                   'ok', t
              from generate_series(1, ${shape.pastLoans}::int) g,
                   lateral (select now() - interval '3 years' + make_interval(secs => (g::double precision / ${shape.pastLoans}) * 3 * 365 * 86400 - 86400 * 30) as t) x`,
      );
      await run(
        'past loan lines',
        sql`insert into loan_lines (id, loan_id, space_id, part_id, location_id, qty, returned_qty, return_condition)
            select pg_temp.lid(8, ${space}, g), pg_temp.lid(6, ${space}, g), pg_temp.lid(1, ${space}, 0), pg_temp.lid(3, ${space}, ${part}),
                   pg_temp.lid(4, ${space}, ${part} % ${BINS}), 1, 1, 'ok'
              from generate_series(1, ${shape.pastLoans}::int) g`,
      );
      // Open loans: members 1.. of each space hold a few; the first overdue ones per space are 3 days late.
      await run(
        'open loans',
        sql`insert into loans (id, space_id, borrower_id, lent_by_id, status, out_at, due_at, check_verdict, created_at)
            select pg_temp.lid(7, s, o), pg_temp.lid(1, s, 0), pg_temp.lid(2, s, 1 + o % ${M - 1}),
                   pg_temp.lid(2, s, 0), 'out', out_at, out_at + interval '14 days', 'ok', out_at
              from generate_series(1, ${S}::int) s, generate_series(0, ${shape.openPerSpace - 1}::int) o,
                   lateral (select case when s <= ${shape.overdueSpaces}::int and o < ${shape.overduePerSpace}::int
                                        then now() - interval '17 days' else now() - interval '2 days' end as out_at) x`,
      );
      await run(
        'open loan lines',
        sql`insert into loan_lines (loan_id, space_id, part_id, location_id, qty)
            select pg_temp.lid(7, s, o), pg_temp.lid(1, s, 0), pg_temp.lid(3, s, 14 + 20 * o),
                   pg_temp.lid(4, s, (14 + 20 * o) % ${BINS}), 1
              from generate_series(1, ${S}::int) s, generate_series(0, ${shape.openPerSpace - 1}::int) o`,
      );
    } finally {
      const t = Date.now();
      for (const statement of rebuild) await sql.raw(statement).execute(c);
      log(`rebuilt ${rebuild.length} indexes and keys: ${((Date.now() - t) / 1000).toFixed(1)} s`);
      await sql`set session_replication_role = origin`.execute(c);
    }
    const t = Date.now();
    await sql`analyze`.execute(c);
    log(`analyze: ${((Date.now() - t) / 1000).toFixed(1)} s`);
  });
}
