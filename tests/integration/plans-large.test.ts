import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { execFile } from 'node:child_process';
import path from 'node:path';
import { promisify } from 'node:util';
import { Kysely, PostgresDialect, sql, type LogEvent } from 'kysely';
import pg from 'pg';
import { createDb, type Db } from '@/db/connect';
import type { Database } from '@/db/types';
import { encodeCode } from '@/labels/code';
import type { Ctx } from '@/lib/auth/roles';
import { resolveCode } from '@/lib/inventory/resolve';
import { listParts } from '@/lib/inventory/parts-list';
import { partListQuerySchema } from '@/lib/inventory/schemas';
import { borrow } from '@/lib/loans/borrow';
import { borrowSchema } from '@/lib/loans/schemas';
import { runReminderSweep } from '@/lib/reminders/sweep';
import { generateLargeShape, LARGE, LARGE_CODE_BASE, largeIds } from '@/bench/large-shape';
import { closeTestDb, testDb } from '../helpers/db';

// The product's own statements at the large shape (50 spaces × 10,000 parts, 1,000,000 past loans),
// planned by PostgreSQL with real statistics: no sequential scan of a table over 10,000 rows.
// The statements are captured from the services themselves (Kysely's query log while they run against
// the large database), then each is planned again with EXPLAIN (FORMAT JSON) and its own parameters.
// The shape lives in a database of its own on the test cluster (bench/large-shape.ts writes it with a
// few INSERT … SELECT over generate_series), so the shared test database is never touched.
//
// Working on this file by hand: OHM_PLANS_DATABASE_URL names a database that already holds the shape
// (migrated, generated, analysed); the test then uses it as it is and drops nothing.

const ROOT = path.resolve(__dirname, '../..');
const run = promisify(execFile);
const reuse = process.env.OHM_PLANS_DATABASE_URL;
const dbName = `ohm_plans_${Date.now().toString(36)}_${Math.random().toString(36).slice(2, 8)}`;
const BIG = 10_000;

let url: string;
let plain: Db;
let big: Map<string, number>;

type Captured = { sql: string; parameters: readonly unknown[] };
let captured: Captured[] = [];
/** A Kysely handle on the large database that records every statement it runs. */
let logged: Kysely<Database>;

/** Runs `fn` with the logged handle and returns the statements it ran. */
async function statementsOf(fn: (db: Db) => Promise<unknown>): Promise<Captured[]> {
  captured = [];
  await fn(logged);
  // Transaction control (begin, commit) has no plan.
  const out = captured.filter((s) => /^\s*(select|insert|update|delete|with)\b/i.test(s.sql));
  captured = [];
  return out;
}

type PlanNode = { 'Node Type': string; 'Relation Name'?: string; Plans?: PlanNode[] };
function seqScansIn(node: PlanNode, found: string[] = []): string[] {
  if (node['Node Type'] === 'Seq Scan' && node['Relation Name']) found.push(node['Relation Name']);
  for (const child of node.Plans ?? []) seqScansIn(child, found);
  return found;
}

/** Each statement's sequential scans of a table holding more than 10,000 rows. */
async function bigSeqScans(statements: Captured[]): Promise<{ sql: string; tables: string[] }[]> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const out: { sql: string; tables: string[] }[] = [];
    for (const s of statements) {
      const res = await client.query<{ 'QUERY PLAN': [{ Plan: PlanNode }] }>(`explain (format json) ${s.sql}`, [
        ...s.parameters,
      ]);
      const tables = seqScansIn(res.rows[0]['QUERY PLAN'][0].Plan).filter((t) => (big.get(t) ?? 0) > BIG);
      if (tables.length) out.push({ sql: s.sql, tables });
    }
    return out;
  } finally {
    await client.end();
  }
}

const SPACE = 1;
const ctxOf = (m: number, roles: Ctx['roles']): Ctx => ({
  userId: largeIds.member(SPACE, m),
  email: `member${m}.space${SPACE}@large.invalid`,
  name: `Large member ${SPACE}/${m}`,
  spaceId: largeIds.space(SPACE),
  spaceName: `Large test space ${SPACE}`,
  roles,
  spaces: [],
});

beforeAll(async () => {
  if (reuse) {
    url = reuse;
  } else {
    await sql`create database ${sql.id(dbName)}`.execute(testDb());
    const u = new URL(process.env.DATABASE_URL!);
    u.pathname = `/${dbName}`;
    url = u.toString();
    // Migrated as `npm run db:migrate` does (a child process: the migration files load through Node's import()).
    await run(process.execPath, [path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), 'scripts/migrate.ts'], {
      cwd: ROOT,
      env: { ...process.env, DATABASE_URL: url },
      timeout: 120_000,
    });
  }
  plain = createDb(url, 2);
  if (!reuse) {
    const t = Date.now();
    await generateLargeShape(plain, LARGE, 'not-a-password-hash');
    console.log(`plans-large: shape generated and analysed in ${((Date.now() - t) / 1000).toFixed(1)} s`);
  }
  const rows = await sql<{ relname: string; n: number }>`
    select relname, reltuples::bigint as n from pg_class
     where relkind = 'r' and relnamespace = 'public'::regnamespace`.execute(plain);
  big = new Map(rows.rows.map((r) => [r.relname, Number(r.n)]));
  const pool = new pg.Pool({ connectionString: url, max: 4 });
  logged = new Kysely<Database>({
    dialect: new PostgresDialect({ pool }),
    log: (e: LogEvent) => {
      if (e.level === 'query') captured.push({ sql: e.query.sql, parameters: e.query.parameters });
    },
  });
}, 900_000);

afterAll(async () => {
  await logged?.destroy();
  await plain?.destroy();
  if (!reuse) await sql`drop database if exists ${sql.id(dbName)} with (force)`.execute(testDb());
  await closeTestDb();
});

describe('plans at 50 spaces × 10,000 parts and 1,000,000 past loans', () => {
  test('the shape is there, with statistics that say so', async () => {
    // The planner's own row estimates (ANALYZE ran): what the plans below were made for.
    expect(big.get('parts')).toBeGreaterThan(450_000);
    expect(big.get('loans')).toBeGreaterThan(900_000);
    expect(big.get('loan_lines')).toBeGreaterThan(900_000);
    expect(big.get('label_codes')).toBeGreaterThan(500_000);
    const spaces = await sql<{ n: number }>`select count(*)::int as n from spaces where slug like 'large-%'`.execute(plain);
    expect(spaces.rows[0].n).toBe(LARGE.spaces);
    // A sample of the generated rows holds together: a past loan's line names a part of the loan's space.
    const odd = await sql<{ n: number }>`
      select count(*)::int as n from (select * from loan_lines tablesample system (1)) ll
        join loans l on l.id = ll.loan_id join parts p on p.id = ll.part_id
       where p.space_id <> l.space_id or ll.space_id <> l.space_id`.execute(plain);
    expect(odd.rows[0].n).toBe(0);
  });

  test('the check itself sees a sequential scan when the plan has one', async () => {
    // No index covers check_report: this statement must scan the whole table.
    const found = await bigSeqScans([{ sql: 'select id from loans where check_report is not null', parameters: [] }]);
    expect(found).toEqual([{ sql: expect.any(String), tables: ['loans'] }]);
  });

  test('the scan lookup', async () => {
    // A unit label of space 1 (its codes are numbered from the large shape's base; units start at 10,000).
    const code = encodeCode(LARGE_CODE_BASE + SPACE * 65536 + 10_000 + 7);
    const statements = await statementsOf(async (db) => {
      const found = await resolveCode(db, ctxOf(1, ['member']), code);
      expect(found.kind).toBe('unit');
    });
    expect(statements.length).toBeGreaterThan(0);
    expect(await bigSeqScans(statements)).toEqual([]);
  });

  test('the borrow of a counted part (the whole transaction)', async () => {
    // Part 6 of a space is an LED with stock in bin 6 (bench/large-shape.ts): a build part, so the gate
    // reads the borrower's other open loans too.
    const input = borrowSchema.parse({ counted: [{ partId: largeIds.part(SPACE, 6), locationId: largeIds.bin(SPACE, 6), qty: 1 }] });
    const statements = await statementsOf(async (db) => {
      const loan = await borrow(db, ctxOf(2, ['member']), input);
      expect(loan.id).toMatch(/^[0-9a-f-]{36}$/);
    });
    expect(statements.some((s) => /insert into "loans"/.test(s.sql))).toBe(true);
    expect(await bigSeqScans(statements)).toEqual([]);
  });

  test.each([
    'sort=name&dir=asc&page=1',
    'sort=name&dir=desc&page=37',
    'sort=sku&page=12',
    'sort=onHand&dir=desc&page=3',
    'sort=updatedAt&dir=desc&page=1',
    'category=led&sort=name&page=20',
    'q=white&sort=name&page=4',
    'below=1&sort=name&page=1',
    'tracking=unit&sort=category&page=2',
  ])('the parts table page: %s', async (query) => {
    const q = partListQuerySchema.parse(Object.fromEntries(new URLSearchParams(query)));
    const statements = await statementsOf(async (db) => {
      const page = await listParts(db, ctxOf(0, ['steward']), q);
      expect(page.total).toBeGreaterThan(0);
    });
    expect(await bigSeqScans(statements)).toEqual([]);
  });

  test('the overdue round (the scheduled reminder sweep over every space)', async () => {
    const statements = await statementsOf(async (db) => {
      await runReminderSweep(db, new Date());
    });
    // The overdue loans of the shape were owed a reminder each (by this round, or an earlier one).
    const owed = await sql<{ n: number }>`select count(*)::int as n from reminders where kind = 'overdue'`.execute(plain);
    expect(owed.rows[0].n).toBeGreaterThanOrEqual(LARGE.overdueSpaces * LARGE.overduePerSpace);
    expect(statements.some((s) => /from "loans"/.test(s.sql))).toBe(true);
    expect(await bigSeqScans(statements)).toEqual([]);
  });
});
