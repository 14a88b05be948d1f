import { sql, type Kysely } from 'kysely';

// Deposits and charges (issue 16).
//
// kit_templates.deposit_minor: a costly kit's deposit, in the space's currency (integer minor units,
// ISO 4217), or null for none. A borrow of a box of such a kit waits until the deposit is paid.
// deposits: one per loan that needs one. pending (checkout open) → held (paid) → releasing (the amounts
// are fixed: what is kept for charges, what goes back) → released (the processor's refund is booked);
// a deposit never paid ends as `ended`. Each step is a guarded update, so it happens once.
// charges: what a member owes for a missing or damaged part, each with its note and item; the part of
// it taken from the loan's deposit is from_deposit_minor, the rest is owed until settled.
// loans.status gains `cancelled`: a borrow given up before it became a loan (its items went back).

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`alter table kit_templates add column deposit_minor integer
            check (deposit_minor is null or (deposit_minor > 0 and deposit_minor <= 99999999))`.execute(db);

  await sql`alter table loans drop constraint if exists loans_status_check`.execute(db);
  await sql`alter table loans add constraint loans_status_check
            check (status in ('waiting','out','back_unchecked','returned','returned_short','cancelled'))`.execute(db);
  await sql`alter table loans add column cancelled_at timestamptz`.execute(db);

  await sql`create unique index if not exists loans_space_id_id_uq on loans (space_id, id)`.execute(db);
  await sql`create unique index if not exists loan_lines_space_id_id_uq on loan_lines (space_id, id)`.execute(db);

  await sql`
    create table deposits (
      id uuid primary key default gen_random_uuid(),
      space_id uuid not null references spaces (id) on delete cascade,
      loan_id uuid not null unique,
      amount_minor integer not null check (amount_minor > 0),
      currency text not null check (currency ~ '^[A-Z]{3}$'),
      status text not null default 'pending'
        check (status in ('pending','held','releasing','released','ended')),
      -- What the loan becomes once the deposit is paid: out at once, or waiting for a steward's hand-over.
      starts_as text not null check (starts_as in ('out','waiting')),
      checkout_session_id text unique,
      checkout_url text,
      payment_intent_id text unique,
      paid_at timestamptz,
      kept_minor integer not null default 0 check (kept_minor >= 0 and kept_minor <= amount_minor),
      released_minor integer check (released_minor is null or (released_minor >= 0 and released_minor <= amount_minor)),
      refund_id text unique,
      release_started_at timestamptz,
      released_at timestamptz,
      ended_at timestamptz,
      created_at timestamptz not null default now(),
      foreign key (space_id, loan_id) references loans (space_id, id) on delete cascade,
      check (released_minor is null or kept_minor + released_minor = amount_minor)
    )`.execute(db);
  await sql`create unique index deposits_space_id_id_uq on deposits (space_id, id)`.execute(db);
  await sql`create index deposits_space_paid_idx on deposits (space_id, paid_at)`.execute(db);
  await sql`create index deposits_space_released_idx on deposits (space_id, released_at)`.execute(db);

  await sql`
    create table charges (
      id uuid primary key default gen_random_uuid(),
      space_id uuid not null references spaces (id) on delete cascade,
      user_id uuid not null,
      loan_id uuid,
      loan_line_id uuid,
      kind text not null check (kind in ('missing','damaged')),
      item text not null check (length(item) between 1 and 300),
      note text not null default '' check (length(note) <= 2000),
      amount_minor integer not null check (amount_minor > 0 and amount_minor <= 99999999),
      currency text not null check (currency ~ '^[A-Z]{3}$'),
      from_deposit_minor integer not null default 0,
      settled_minor integer not null default 0,
      created_by uuid references users (id) on delete set null,
      created_at timestamptz not null default now(),
      check (from_deposit_minor >= 0 and settled_minor >= 0 and from_deposit_minor + settled_minor <= amount_minor),
      foreign key (space_id, user_id) references memberships (space_id, user_id) on delete cascade,
      foreign key (space_id, loan_id) references loans (space_id, id) on delete cascade,
      foreign key (space_id, loan_line_id) references loan_lines (space_id, id) on delete cascade
    )`.execute(db);
  await sql`create unique index charges_space_id_id_uq on charges (space_id, id)`.execute(db);
  await sql`create index charges_person_idx on charges (space_id, user_id)`.execute(db);
  await sql`create index charges_space_created_idx on charges (space_id, created_at)`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`drop table if exists charges`.execute(db);
  await sql`drop table if exists deposits`.execute(db);
  await sql`delete from loan_lines where loan_id in (select id from loans where status = 'cancelled')`.execute(db);
  await sql`delete from loans where status = 'cancelled'`.execute(db);
  await sql`alter table loans drop column if exists cancelled_at`.execute(db);
  await sql`alter table loans drop constraint if exists loans_status_check`.execute(db);
  await sql`alter table loans add constraint loans_status_check
            check (status in ('waiting','out','back_unchecked','returned','returned_short'))`.execute(db);
  await sql`alter table kit_templates drop column if exists deposit_minor`.execute(db);
  // loans_space_id_id_uq / loan_lines_space_id_id_uq stay: other composite keys may stand on them.
}
