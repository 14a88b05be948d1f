import { sql, type Kysely } from 'kysely';

// Who may borrow what (issue 16).
//
// inductions: what a space shows its members before they may borrow certain things, in its own words.
// kit_template_inductions / category_inductions: which inductions a kit template or a part category needs.
// induction_signoffs: a steward's word that a member was shown (who, when, optional expiry, note); revoked
// rather than deleted, so the record stays.
// loans.induction_override_*: a steward lending although a sign-off is missing, with the reason (the
// compatibility check's override keeps its own columns).
//
// Space-owned children reference their parents by (space_id, id), so a row can never point into another
// space.

const CATEGORIES = `('driver','led','supply','heat_sink','wire','kit_box','tool','meter','consumable','other')`;

export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('inductions')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('description', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('archived_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`create unique index inductions_space_name_uq on inductions (space_id, lower(name))`.execute(db);
  await sql`create unique index if not exists inductions_space_id_id_uq on inductions (space_id, id)`.execute(db);
  await sql`create unique index if not exists kit_templates_space_id_id_uq on kit_templates (space_id, id)`.execute(db);

  await sql`create table kit_template_inductions (
    space_id uuid not null,
    template_id uuid not null,
    induction_id uuid not null,
    primary key (template_id, induction_id),
    foreign key (space_id, template_id) references kit_templates (space_id, id) on delete cascade,
    foreign key (space_id, induction_id) references inductions (space_id, id) on delete cascade
  )`.execute(db);
  await sql`create index kit_template_inductions_induction_idx on kit_template_inductions (induction_id)`.execute(db);

  await sql`create table category_inductions (
    space_id uuid not null references spaces (id) on delete cascade,
    category text not null check (category in ${sql.raw(CATEGORIES)}),
    induction_id uuid not null,
    primary key (space_id, category, induction_id),
    foreign key (space_id, induction_id) references inductions (space_id, id) on delete cascade
  )`.execute(db);

  await sql`create table induction_signoffs (
    id uuid primary key default gen_random_uuid(),
    space_id uuid not null,
    induction_id uuid not null,
    user_id uuid not null,
    signed_by uuid references users (id),
    signed_at timestamptz not null default now(),
    expires_at timestamptz,
    note text not null default '',
    revoked_at timestamptz,
    revoked_by uuid references users (id),
    foreign key (space_id, induction_id) references inductions (space_id, id) on delete cascade,
    foreign key (space_id, user_id) references memberships (space_id, user_id) on delete cascade,
    check (expires_at is null or expires_at > signed_at)
  )`.execute(db);
  await sql`create index induction_signoffs_person_idx on induction_signoffs (space_id, user_id, induction_id)`.execute(db);

  await db.schema
    .alterTable('loans')
    .addColumn('induction_override_reason', 'text')
    .addColumn('induction_override_by', 'uuid', (c) => c.references('users.id'))
    // Bench hand-over: a member's borrow waits at the bench until a steward hands it over; a member's
    // return is back, not yet checked, until a steward confirms what came back.
    .addColumn('handed_over_by', 'uuid', (c) => c.references('users.id'))
    .addColumn('handed_over_at', 'timestamptz')
    .addColumn('back_reported_at', 'timestamptz')
    .addColumn('back_note', 'text')
    .execute();
  await sql`alter table loans drop constraint if exists loans_status_check`.execute(db);
  await sql`alter table loans add constraint loans_status_check
            check (status in ('waiting','out','back_unchecked','returned','returned_short'))`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  // Loans still waiting are dropped back to out, and unchecked returns count as still out.
  await sql`update loans set status = 'out' where status in ('waiting','back_unchecked')`.execute(db);
  await sql`alter table loans drop constraint if exists loans_status_check`.execute(db);
  await sql`alter table loans add constraint loans_status_check check (status in ('out','returned','returned_short'))`.execute(db);
  await db.schema
    .alterTable('loans')
    .dropColumn('back_note')
    .dropColumn('back_reported_at')
    .dropColumn('handed_over_at')
    .dropColumn('handed_over_by')
    .dropColumn('induction_override_by')
    .dropColumn('induction_override_reason')
    .execute();
  await db.schema.dropTable('induction_signoffs').execute();
  await db.schema.dropTable('category_inductions').execute();
  await db.schema.dropTable('kit_template_inductions').execute();
  await db.schema.dropTable('inductions').execute();
  // kit_templates_space_id_id_uq may be shared with the composite keys of 0005; it is left in place.
}
