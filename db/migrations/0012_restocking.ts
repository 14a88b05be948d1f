import { sql, type Kysely } from 'kysely';

// Restocking (issue 13): a space's suppliers, what each offers for a part (their reference, pack size,
// price per pack), the order lists a steward sends them, and what arrived against each. Every table is
// owned by a space and points at other rows only through (space_id, x_id), so an order cannot name
// another space's supplier, part or bin. Money is integer minor units of the order's ISO 4217 currency.
//
// Order list states (our words): draft (being put together), sent (with the supplier), part_in (some
// of it has arrived), all_in (everything arrived, or the steward said nothing more is coming) and
// called_off (cancelled; what arrived before stays on the shelf).

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`create unique index if not exists parts_space_id_id_uq on parts (space_id, id)`.execute(db);
  await sql`create unique index if not exists locations_space_id_id_uq on locations (space_id, id)`.execute(db);
  await sql`
    create table suppliers (
      id uuid primary key default gen_random_uuid(),
      space_id uuid not null references spaces (id) on delete cascade,
      name text not null check (length(btrim(name)) between 1 and 120),
      website text not null default '',
      email text not null default '',
      lead_days integer not null default 7 check (lead_days between 0 and 365),
      min_order_minor integer not null default 0 check (min_order_minor >= 0),
      notes text not null default '',
      archived_at timestamptz,
      created_at timestamptz not null default now()
    )`.execute(db);
  await sql`create unique index if not exists suppliers_space_id_id_uq on suppliers (space_id, id)`.execute(db);
  await sql`create unique index suppliers_space_name_uq on suppliers (space_id, lower(name))`.execute(db);

  await sql`
    create table supplier_offers (
      id uuid primary key default gen_random_uuid(),
      space_id uuid not null references spaces (id) on delete cascade,
      supplier_id uuid not null,
      part_id uuid not null,
      item_ref text not null default '' check (length(item_ref) <= 80),
      pack_size integer not null check (pack_size between 1 and 100000),
      pack_price_minor integer not null check (pack_price_minor between 0 and 100000000),
      preferred boolean not null default false,
      created_at timestamptz not null default now(),
      foreign key (space_id, supplier_id) references suppliers (space_id, id) on delete cascade,
      foreign key (space_id, part_id) references parts (space_id, id) on delete cascade,
      unique (space_id, supplier_id, part_id)
    )`.execute(db);
  await sql`create unique index if not exists supplier_offers_space_id_id_uq on supplier_offers (space_id, id)`.execute(db);
  // One preferred offer per part at most.
  await sql`create unique index supplier_offers_preferred_uq on supplier_offers (space_id, part_id) where preferred`.execute(db);

  await sql`
    create table order_lists (
      id uuid primary key default gen_random_uuid(),
      space_id uuid not null references spaces (id) on delete cascade,
      supplier_id uuid not null,
      state text not null default 'draft' check (state in ('draft', 'sent', 'part_in', 'all_in', 'called_off')),
      currency char(3) not null,
      note text not null default '',
      created_by uuid references users (id) on delete set null,
      created_at timestamptz not null default now(),
      sent_at timestamptz,
      sent_by uuid references users (id) on delete set null,
      expected_at timestamptz,
      approved_at timestamptz,
      approved_by uuid references users (id) on delete set null,
      approval_note text,
      closed_at timestamptz,
      cancel_note text,
      foreign key (space_id, supplier_id) references suppliers (space_id, id)
    )`.execute(db);
  await sql`create unique index if not exists order_lists_space_id_id_uq on order_lists (space_id, id)`.execute(db);
  await sql`create index order_lists_state_idx on order_lists (space_id, state, sent_at)`.execute(db);

  await sql`
    create table order_lines (
      id uuid primary key default gen_random_uuid(),
      space_id uuid not null references spaces (id) on delete cascade,
      order_id uuid not null,
      part_id uuid not null,
      item_ref text not null default '',
      pack_size integer not null check (pack_size between 1 and 100000),
      packs integer not null check (packs between 1 and 100000),
      pack_price_minor integer not null check (pack_price_minor between 0 and 100000000),
      received_units integer not null default 0 check (received_units >= 0),
      foreign key (space_id, order_id) references order_lists (space_id, id) on delete cascade,
      foreign key (space_id, part_id) references parts (space_id, id),
      unique (space_id, order_id, part_id)
    )`.execute(db);
  await sql`create unique index if not exists order_lines_space_id_id_uq on order_lines (space_id, id)`.execute(db);

  // One row per "received" press. The idempotency key makes a double click (or a retried request) the
  // same receipt: the second finds the first's row and answers with it.
  await sql`
    create table order_receipts (
      id uuid primary key default gen_random_uuid(),
      space_id uuid not null references spaces (id) on delete cascade,
      order_id uuid not null,
      idempotency_key text not null check (length(idempotency_key) between 8 and 100),
      received_by uuid references users (id) on delete set null,
      received_at timestamptz not null default now(),
      result jsonb not null default '{}'::jsonb,
      foreign key (space_id, order_id) references order_lists (space_id, id) on delete cascade,
      unique (space_id, idempotency_key)
    )`.execute(db);
  await sql`create unique index if not exists order_receipts_space_id_id_uq on order_receipts (space_id, id)`.execute(db);

  // What arrived, at the price paid: the spend the treasurer sees is the sum of cost_minor.
  await sql`
    create table order_receipt_lines (
      id uuid primary key default gen_random_uuid(),
      space_id uuid not null references spaces (id) on delete cascade,
      receipt_id uuid not null,
      line_id uuid not null,
      part_id uuid not null,
      location_id uuid,
      units integer not null check (units >= 1),
      cost_minor integer not null check (cost_minor >= 0),
      foreign key (space_id, receipt_id) references order_receipts (space_id, id) on delete cascade,
      foreign key (space_id, line_id) references order_lines (space_id, id) on delete cascade,
      foreign key (space_id, part_id) references parts (space_id, id),
      foreign key (space_id, location_id) references locations (space_id, id) on delete set null (location_id)
    )`.execute(db);
  await sql`create index order_receipt_lines_receipt_idx on order_receipt_lines (space_id, receipt_id)`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`drop table if exists order_receipt_lines`.execute(db);
  await sql`drop table if exists order_receipts`.execute(db);
  await sql`drop table if exists order_lines`.execute(db);
  await sql`drop table if exists order_lists`.execute(db);
  await sql`drop table if exists supplier_offers`.execute(db);
  await sql`drop table if exists suppliers`.execute(db);
  // parts_space_id_id_uq and locations_space_id_id_uq stay: other tables' composite keys stand on them.
}
