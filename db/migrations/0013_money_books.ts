import { sql, type Kysely } from 'kysely';

// Issue 13, the money side. Each sale keeps the tax it was sold under (mode, rate, amount), so a later
// change of the space's rate never moves a past sale; a refund keeps the tax it gave back. A sale
// says where it was rung up: at the counter, or recorded by the member at the honour box. The box's
// counts (expected against counted, a difference explained) and its bankings are rows of their own.
// Existing sales read as tax-exempt counter sales: their stored amounts are untouched.

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    alter table sales
      add column tax_mode text not null default 'exempt' check (tax_mode in ('exempt','inclusive','exclusive')),
      add column tax_rate_bp integer not null default 0 check (tax_rate_bp between 0 and 10000),
      add column tax_minor integer not null default 0 check (tax_minor >= 0 and tax_minor <= total_minor),
      add column channel text not null default 'counter' check (channel in ('counter','honour_box'))`.execute(db);
  await sql`
    alter table refunds
      add column tax_minor integer not null default 0 check (tax_minor >= 0 and tax_minor <= amount_minor)`.execute(db);

  await sql`
    create table honour_box_counts (
      id uuid primary key default gen_random_uuid(),
      space_id uuid not null references spaces (id) on delete cascade,
      currency char(3) not null,
      counted_at timestamptz not null,
      counted_by uuid references users (id) on delete set null,
      since timestamptz,
      carried_minor integer not null,
      cash_sales_minor integer not null,
      cash_refunds_minor integer not null,
      expected_minor integer not null,
      counted_minor integer not null check (counted_minor >= 0),
      note text not null default '' check (length(note) <= 2000),
      check (expected_minor = carried_minor + cash_sales_minor - cash_refunds_minor),
      check (counted_minor = expected_minor or length(btrim(note)) > 0)
    )`.execute(db);
  await sql`create unique index honour_box_counts_space_id_id_uq on honour_box_counts (space_id, id)`.execute(db);
  await sql`create index honour_box_counts_space_at_idx on honour_box_counts (space_id, counted_at)`.execute(db);

  await sql`
    create table honour_box_bankings (
      id uuid primary key default gen_random_uuid(),
      space_id uuid not null references spaces (id) on delete cascade,
      count_id uuid not null,
      amount_minor integer not null check (amount_minor > 0),
      reference text not null default '' check (length(reference) <= 200),
      banked_at timestamptz not null,
      banked_by uuid references users (id) on delete set null,
      foreign key (space_id, count_id) references honour_box_counts (space_id, id) on delete cascade,
      unique (space_id, count_id)
    )`.execute(db);
  await sql`create unique index honour_box_bankings_space_id_id_uq on honour_box_bankings (space_id, id)`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`drop table if exists honour_box_bankings`.execute(db);
  await sql`drop table if exists honour_box_counts`.execute(db);
  await sql`alter table refunds drop column if exists tax_minor`.execute(db);
  await sql`
    alter table sales drop column if exists channel, drop column if exists tax_minor,
      drop column if exists tax_rate_bp, drop column if exists tax_mode`.execute(db);
}
