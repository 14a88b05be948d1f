// The SQL of the two benchmarked routes, written out as plain statements for the two baselines:
// the framework floor (app/api/bench-floor/**, a bare route handler in the same Next.js build) and the
// raw floor (bench/raw-floor.ts, node:http). Both run exactly this through `pg`, so the only difference
// between them is the HTTP stack. The statements follow what the product runs —
// lib/inventory/resolve.ts resolveCode and lib/loans/borrow.ts borrow (counted stock, no chain: the lock
// with the lending rules, the part, the standing and induction reads, the open-loan count, the loan, the
// stock and one statement for line, movement and audit row) — minus the sign-in lookups, input validation
// and space scoping the product adds around them. A concern added to the borrow is added here too.
import pg, { type Pool, type PoolClient } from 'pg';

/** The floors' own pool: as many connections as the app's (db/connect.ts). */
export function floorPool(connectionString: string): Pool {
  const pool = new pg.Pool({ connectionString, max: 10 });
  pool.on('error', () => undefined);
  return pool;
}

export type Lookup = {
  code: string;
  kind: string;
  targetId: string;
  name: string;
  partId?: string;
  state?: string;
} | null;

/**
 * Scan → item: the label joined to what it labels in one round trip — the statement
 * lib/inventory/resolve.ts labelsWithTargets builds, without the caller's space filter.
 */
const LOOKUP_SQL = `
  select lc.code, lc.kind, lc.target_id,
         coalesce(up.name || coalesce(' (' || u.serial || ')', ''), p.name, l.name, k.name) as name,
         coalesce(u.part_id, p.id) as part_id,
         coalesce(u.state, k.state) as state
    from label_codes lc
    left join units u on u.id = lc.target_id and lc.kind = 'unit' and u.space_id = lc.space_id
    left join parts up on up.id = u.part_id
    left join parts p on p.id = lc.target_id and lc.kind = 'part' and p.space_id = lc.space_id
    left join locations l on l.id = lc.target_id and lc.kind = 'location' and l.space_id = lc.space_id
    left join kit_boxes k on k.id = lc.target_id and lc.kind = 'kit_box' and k.space_id = lc.space_id
   where lc.code = $1`;

export async function lookupByCode(pool: Pool, code: string): Promise<Lookup> {
  const row = (
    await pool.query<{
      code: string;
      kind: string;
      target_id: string;
      name: string | null;
      part_id: string | null;
      state: string | null;
    }>(LOOKUP_SQL, [code])
  ).rows[0];
  if (!row || row.name === null) return null;
  return {
    code: row.code,
    kind: row.kind,
    targetId: row.target_id,
    name: row.name,
    ...(row.part_id ? { partId: row.part_id } : {}),
    ...(row.state ? { state: row.state } : {}),
  };
}

export type BorrowInput = { spaceId: string; borrowerId: string; partId: string; locationId: string };

class Conflict extends Error {}

/**
 * The borrow of one counted item, as lib/loans/borrow.ts runs it: one transaction of lock (with the
 * space's lending rules), part, standing (overdue loans), inductions the category asks for, open-loan
 * count, loan, guarded stock update, and one statement for the line, the stock movement and the audit row.
 */
export async function borrowCounted(
  pool: Pool,
  b: BorrowInput,
): Promise<{ id: string } | { conflict: string }> {
  const client = await pool.connect();
  try {
    await client.query('begin');
    const result = await borrowInTransaction(client, b);
    await client.query('commit');
    return result;
  } catch (err) {
    await client.query('rollback').catch(() => undefined);
    if (err instanceof Conflict) return { conflict: err.message };
    throw err;
  } finally {
    client.release();
  }
}

async function borrowInTransaction(client: PoolClient, b: BorrowInput): Promise<{ id: string }> {
  const settings = (
    await client.query<{ loan_days: number; max_open_loans: number }>(
      `select m.user_id, s.name, s.loan_days, s.closing_time, s.time_zone, s.max_open_loans, s.reminder_days_before,
              s.reminder_every_days, s.ambient_c, s.settings
         from memberships m inner join spaces s on s.id = m.space_id
        where m.space_id = $1 and m.user_id = $2 for update of m`,
      [b.spaceId, b.borrowerId],
    )
  ).rows[0];
  const part = (
    await client.query<{ name: string; category: string }>(
      `select parts.id, parts.name, parts.sku, parts.category, parts.specs, parts.lendable, parts.tracking, locations.name as location_name
       from parts inner join locations on locations.id = $1 where parts.id = $2`,
      [b.locationId, b.partId],
    )
  ).rows[0];
  const at = new Date();
  // Standing: the borrower's overdue loans (lib/rules/standing.ts), read under the borrower's lock.
  const late = await client.query(
    `select loans.id, loans.due_at, kit_boxes.name as box,
            (select string_agg(p.name, ', ' order by p.name) from loan_lines ll
               join parts p on p.space_id = ll.space_id and p.id = ll.part_id
              where ll.space_id = loans.space_id and ll.loan_id = loans.id) as parts
       from loans left join kit_boxes on kit_boxes.id = loans.kit_box_id
      where loans.space_id = $1 and loans.borrower_id = $2 and loans.status = 'out' and loans.due_at < $3
      order by loans.due_at`,
    [b.spaceId, b.borrowerId, at],
  );
  if (late.rowCount) throw new Conflict('overdue');
  // The induction gate: what the part's category asks for (lib/inductions/gate.ts).
  const needed = await client.query(
    `select i.id, i.name, c.category from category_inductions c
       inner join inductions i on i.id = c.induction_id and i.space_id = c.space_id
      where c.space_id = $1 and c.category in ($2) and i.archived_at is null`,
    [b.spaceId, part?.category ?? ''],
  );
  if (needed.rowCount) throw new Conflict('induction needed');
  const open = (
    await client.query<{ n: string }>(
      `select count(*) as n from loans where space_id = $1 and borrower_id = $2 and status = 'out'`,
      [b.spaceId, b.borrowerId],
    )
  ).rows[0];
  if (Number(open.n) >= settings.max_open_loans) throw new Conflict('open-loan limit');
  const due = new Date(at.getTime() + settings.loan_days * 86_400_000);
  const loan = (
    await client.query<{ id: string }>(
      `insert into loans (space_id, borrower_id, lent_by_id, kit_box_id, out_at, due_at, check_verdict, check_report,
         caution_acknowledged, override_reason, override_by, created_at)
       values ($1, $2, $2, null, $3, $4, null, $5, false, null, null, $3) returning id`,
      [b.spaceId, b.borrowerId, at, due, JSON.stringify({ kind: 'none', cautions: [] })],
    )
  ).rows[0];
  const left = await client.query(
    `update stock set qty = qty - 1, updated_at = $1 where part_id = $2 and location_id = $3 and qty >= 1 returning qty`,
    [at, b.partId, b.locationId],
  );
  if (!left.rowCount) throw new Conflict('bin empty');
  await client.query(
    `with written_lines as (
       insert into loan_lines (loan_id, space_id, part_id, unit_id, location_id, qty, chain_role)
       values ($1, $2, $3, null, $4, 1, null) returning id),
     written_moves as (
       insert into stock_movements (space_id, part_id, location_id, unit_id, qty_delta, reason, ref_type, ref_id, actor_id, created_at)
       values ($2, $3, $4, null, -1, 'loan_out', 'loan', $1, $5, $6) returning id)
     insert into audit_log (space_id, actor_id, action, target_type, target_id, detail) values ($2, $5, 'loan.created', 'loan', $1, $7)`,
    [
      loan.id,
      b.spaceId,
      b.partId,
      b.locationId,
      b.borrowerId,
      at,
      JSON.stringify({ borrowerId: b.borrowerId, items: [{ part: part?.name, qty: 1 }], dueAt: due.toISOString() }),
    ],
  );
  return { id: loan.id };
}
