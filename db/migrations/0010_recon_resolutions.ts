import { sql, type Kysely } from 'kysely';

// The treasurer's resolution notes on reconciliation rows: why a row that does not match is
// nonetheless in order (or what was done about it), who wrote it and when. One note per row of a
// space's reconciliation, keyed by the row's stable key (the processor's ledger entry, or our sale or
// refund when the processor has none); writing again replaces it, and the audit log keeps every
// version. A note about a sale points at it through (space_id, sale_id), so it can only name a sale
// of its own space.

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`create unique index if not exists sales_space_id_id_uq on sales (space_id, id)`.execute(db);
  await sql`
    create table recon_resolutions (
      id uuid primary key default gen_random_uuid(),
      space_id uuid not null references spaces (id) on delete cascade,
      month date not null,
      row_key text not null check (length(row_key) between 1 and 200),
      sale_id uuid,
      note text not null check (length(btrim(note)) between 1 and 2000),
      written_by uuid references users (id) on delete set null,
      written_at timestamptz not null default now(),
      foreign key (space_id, sale_id) references sales (space_id, id) on delete cascade,
      unique (space_id, row_key)
    )`.execute(db);
  await sql`create index recon_resolutions_month_idx on recon_resolutions (space_id, month)`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`drop table if exists recon_resolutions`.execute(db);
  // sales_space_id_id_uq stays: other tables' composite keys may stand on it.
}
