import 'server-only';
import { scoped } from '@/db/scoped';
import JSZip from 'jszip';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import type { Ctx } from '@/lib/auth/roles';
import { writeCsv } from '@/lib/csv';

// A space's data out, whole: every table the space owns as one CSV (through writeCsv, so every cell is
// formula-guarded) in one zip, with the part attachments as files. "Owns" is read from the schema, not
// listed by hand, so a table a later migration adds is exported too: a table with a space_id column
// (rows of this space), a table without one whose foreign key points at such a table (rows whose parent
// is this space's), the space itself, and the people who are members. Credentials never leave:
// password hashes, token hashes, calendar tokens and any column named like a secret or key.

const SKIP_TABLES = new Set(['kysely_migration', 'kysely_migration_lock', 'rate_limits', 'users', 'spaces', 'auth_sessions', 'sign_in_tokens', 'backup_runs']);
const SECRET_COLUMN = /password|secret|token|_key$|^data$/i;

type Table = { name: string; columns: string[] };
type Child = Table & { fk: string; parent: string };

async function ownedTables(db: Db): Promise<{ direct: Table[]; children: Child[] }> {
  const cols = await sql<{ table_name: string; columns: string[] }>`
    select c.table_name, array_agg(c.column_name::text order by c.ordinal_position) as columns
    from information_schema.columns c
    join information_schema.tables t on t.table_schema = c.table_schema and t.table_name = c.table_name and t.table_type = 'BASE TABLE'
    where c.table_schema = 'public'
    group by c.table_name order by c.table_name`.execute(db);
  const byName = new Map(cols.rows.map((r) => [r.table_name, r.columns]));
  const direct = cols.rows.filter((r) => r.columns.includes('space_id') && !SKIP_TABLES.has(r.table_name)).map((r) => ({ name: r.table_name, columns: r.columns }));
  const owned = new Set(direct.map((t) => t.name));
  const fks = await sql<{ child: string; col: string; parent: string }>`
    select cl.relname::text as child, a.attname::text as col, pl.relname::text as parent
    from pg_constraint k
    join pg_class cl on cl.oid = k.conrelid
    join pg_class pl on pl.oid = k.confrelid
    join pg_namespace n on n.oid = cl.relnamespace
    join pg_attribute a on a.attrelid = k.conrelid and a.attnum = k.conkey[1]
    where k.contype = 'f' and n.nspname = 'public' and cardinality(k.conkey) = 1
    order by 1, 2`.execute(db);
  const children: Child[] = [];
  for (const fk of fks.rows) {
    if (owned.has(fk.child) || SKIP_TABLES.has(fk.child) || !owned.has(fk.parent)) continue;
    if (children.some((c) => c.name === fk.child)) continue; // one parent is enough to scope it
    children.push({ name: fk.child, columns: byName.get(fk.child) ?? [], fk: fk.col, parent: fk.parent });
  }
  return { direct, children };
}

function cellOf(v: unknown): unknown {
  if (v === null || v === undefined) return '';
  if (v instanceof Date) return v.toISOString();
  if (Buffer.isBuffer(v)) return `(${v.length} bytes)`;
  if (typeof v === 'object') return JSON.stringify(v);
  return v;
}

function csvOf(columns: string[], rows: Record<string, unknown>[]): string {
  const keep = columns.filter((c) => !SECRET_COLUMN.test(c));
  return writeCsv(keep, rows.map((r) => keep.map((c) => cellOf(r[c]))));
}

/** The names of the CSV files an export holds (for the Settings page and the tests). */
export async function exportedTableNames(db: Db): Promise<string[]> {
  const { direct, children } = await ownedTables(db);
  return ['space', 'people', ...direct.map((t) => t.name), ...children.map((t) => t.name)].sort();
}

export async function exportSpace(db: Db, ctx: Ctx): Promise<{ filename: string; zip: Uint8Array }> {
  const zip = new JSZip();
  const { direct, children } = await ownedTables(db);
  // One snapshot: every file describes the same moment.
  const slug = await db.transaction().setIsolationLevel('repeatable read').setAccessMode('read only').execute(async (trx) => {
    const space = await trx.selectFrom('spaces').selectAll().where('id', '=', ctx.spaceId).executeTakeFirstOrThrow();
    zip.file('space.csv', csvOf(Object.keys(space), [space as Record<string, unknown>]));
    const people = await sql<Record<string, unknown>>`
      select u.id, u.name, u.email, m.roles, m.disabled_at, m.created_at as member_since
      from memberships m join users u on u.id = m.user_id
      where m.space_id = ${ctx.spaceId} order by u.name, u.id`.execute(trx);
    zip.file('people.csv', csvOf(['id', 'name', 'email', 'roles', 'disabled_at', 'member_since'], people.rows));
    for (const t of direct) {
      const r = await sql<Record<string, unknown>>`select * from ${sql.table(t.name)} where space_id = ${ctx.spaceId} order by 1`.execute(trx);
      zip.file(`${t.name}.csv`, csvOf(t.columns, r.rows));
    }
    for (const t of children) {
      const r = await sql<Record<string, unknown>>`
        select c.* from ${sql.table(t.name)} c join ${sql.table(t.parent)} p on p.id = c.${sql.ref(t.fk)}
        where p.space_id = ${ctx.spaceId} order by 1`.execute(trx);
      zip.file(`${t.name}.csv`, csvOf(t.columns, r.rows));
    }
    const files = await scoped(trx, ctx).selectFrom('attachments').select(['id', 'filename', 'data']).where('space_id', '=', ctx.spaceId).execute();
    for (const f of files) zip.file(`attachments/${f.id}-${f.filename.replace(/[^\w.-]+/g, '_')}`, f.data as Uint8Array);
    return space.slug;
  });
  const day = new Date().toISOString().slice(0, 10);
  return { filename: `ohmstead-${slug}-${day}.zip`, zip: await zip.generateAsync({ type: 'uint8array', compression: 'DEFLATE' }) };
}
