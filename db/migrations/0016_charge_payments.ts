import { sql, type Kysely } from 'kysely';

// Paying charges, and late fees (issue 16, what 0011 left).
//
// charge_payments: money a member paid towards their charges, one row per payment. A card payment is
// `pending` while its pay page is open (the checkout session Ohmstead opened for exactly that amount),
// `paid` when the signed webhook reports that session paid, or `ended` when the page expired unpaid.
// Cash recorded by a steward is `paid` at once. The Books read the month's payments from here.
// At most one card payment per member is open at a time (a partial unique index), so two clicks or
// two stewards at the bench open one pay page.
// charges.kind gains 'late' (a late fee, where the space enables one): never two for one loan.

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    create table charge_payments (
      id uuid primary key default gen_random_uuid(),
      space_id uuid not null references spaces (id) on delete cascade,
      user_id uuid not null,
      method text not null check (method in ('card','cash')),
      amount_minor integer not null check (amount_minor > 0 and amount_minor <= 99999999),
      currency text not null check (currency ~ '^[A-Z]{3}$'),
      status text not null default 'pending' check (status in ('pending','paid','ended')),
      checkout_session_id text unique,
      checkout_url text,
      payment_intent_id text unique,
      created_by uuid references users (id) on delete set null,
      created_at timestamptz not null default now(),
      paid_at timestamptz,
      ended_at timestamptz,
      check (method = 'card' or status = 'paid'),
      foreign key (space_id, user_id) references memberships (space_id, user_id) on delete cascade
    )`.execute(db);
  await sql`create unique index charge_payments_space_id_id_uq on charge_payments (space_id, id)`.execute(db);
  await sql`create unique index charge_payments_one_open_uq on charge_payments (space_id, user_id)
            where status = 'pending'`.execute(db);
  await sql`create index charge_payments_space_paid_idx on charge_payments (space_id, paid_at)`.execute(db);

  await sql`alter table charges drop constraint if exists charges_kind_check`.execute(db);
  await sql`alter table charges add constraint charges_kind_check check (kind in ('missing','damaged','late'))`.execute(db);
  // The scheduled retry looks for releases left pending (lib/deposits/jobs.ts), and the Books' month for the
  // deposits whose split was fixed in it (lib/charges/month.ts).
  await sql`create index deposits_release_pending_idx on deposits (release_started_at) where status = 'releasing'`.execute(db);
  await sql`create index deposits_space_release_started_idx on deposits (space_id, release_started_at)`.execute(db);
  await sql`create unique index charges_one_late_fee_uq on charges (space_id, loan_id) where kind = 'late'`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`drop index if exists deposits_space_release_started_idx`.execute(db);
  await sql`drop index if exists deposits_release_pending_idx`.execute(db);
  await sql`drop index if exists charges_one_late_fee_uq`.execute(db);
  await sql`delete from charges where kind = 'late'`.execute(db);
  await sql`alter table charges drop constraint if exists charges_kind_check`.execute(db);
  await sql`alter table charges add constraint charges_kind_check check (kind in ('missing','damaged'))`.execute(db);
  await sql`drop table if exists charge_payments`.execute(db);
}
