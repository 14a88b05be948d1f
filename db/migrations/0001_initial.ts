import { sql, type Kysely } from 'kysely';

// The whole product's schema, laid down at once so later capabilities add screens, not tables.
// Every row a space owns carries space_id (tenancy; the future shard key).

const ROLE_CHECK = sql`roles <@ array['member','steward','treasurer','admin']::text[] and cardinality(roles) > 0`;
const UNIT_STATES = sql`state in ('on_shelf','out','held','in_repair','retired')`;

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`create extension if not exists citext`.execute(db);

  await db.schema
    .createTable('spaces')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('slug', 'text', (c) => c.notNull().unique())
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('currency', 'char(3)', (c) => c.notNull().defaultTo('USD'))
    .addColumn('time_zone', 'text', (c) => c.notNull().defaultTo('UTC'))
    .addColumn('loan_days', 'integer', (c) => c.notNull().defaultTo(14).check(sql`loan_days between 1 and 365`))
    .addColumn('closing_time', 'text', (c) => c.notNull().defaultTo('20:00').check(sql`closing_time ~ '^[0-2][0-9]:[0-5][0-9]$'`))
    .addColumn('max_open_loans', 'integer', (c) => c.notNull().defaultTo(3).check(sql`max_open_loans between 1 and 100`))
    .addColumn('reminder_days_before', 'integer', (c) => c.notNull().defaultTo(2))
    .addColumn('reminder_every_days', 'integer', (c) => c.notNull().defaultTo(3))
    .addColumn('label_layout', 'text', (c) => c.notNull().defaultTo('a4-24'))
    .addColumn('settings', 'jsonb', (c) => c.notNull().defaultTo(sql`'{}'::jsonb`))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable('users')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('email', sql`citext`, (c) => c.notNull().unique())
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('password_hash', 'text')
    .addColumn('disabled_at', 'timestamptz')
    .addColumn('last_space_id', 'uuid', (c) => c.references('spaces.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable('memberships')
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('roles', sql`text[]`, (c) => c.notNull().check(ROLE_CHECK))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('memberships_pk', ['space_id', 'user_id'])
    .execute();
  await db.schema.createIndex('memberships_user_idx').on('memberships').column('user_id').execute();

  await db.schema
    .createTable('invitations')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('email', sql`citext`, (c) => c.notNull())
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('roles', sql`text[]`, (c) => c.notNull().check(ROLE_CHECK))
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('invited_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .addColumn('accepted_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  // One-time e-mail sign-in links; only the hash of the token is kept.
  await db.schema
    .createTable('sign_in_tokens')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .addColumn('used_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  // One registry of label codes across units, parts, bins and kit boxes: /s/<code> is one lookup.
  await db.schema
    .createTable('label_codes')
    .addColumn('code', 'text', (c) => c.primaryKey())
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('kind', 'text', (c) => c.notNull().check(sql`kind in ('unit','part','location','kit_box')`))
    .addColumn('target_id', 'uuid', (c) => c.notNull())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('label_codes_target_idx').on('label_codes').columns(['kind', 'target_id']).execute();

  await db.schema
    .createTable('locations')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('code', 'text', (c) => c.unique().references('label_codes.code'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('kind', 'text', (c) => c.notNull().defaultTo('bin').check(sql`kind in ('bin','shelf','drawer','cabinet','room')`))
    .addColumn('parent_id', 'uuid', (c) => c.references('locations.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint('locations_space_name_uq', ['space_id', 'name'])
    .execute();

  await db.schema
    .createTable('parts')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('sku', 'text', (c) => c.notNull())
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('category', 'text', (c) =>
      c.notNull().check(sql`category in ('driver','led','supply','heat_sink','wire','kit_box','tool','meter','consumable','other')`),
    )
    .addColumn('tracking', 'text', (c) => c.notNull().check(sql`tracking in ('counted','unit')`))
    .addColumn('specs', 'jsonb', (c) => c.notNull().defaultTo(sql`'{}'::jsonb`))
    .addColumn('code', 'text', (c) => c.unique().references('label_codes.code'))
    .addColumn('sellable', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('lendable', 'boolean', (c) => c.notNull().defaultTo(true))
    .addColumn('price_minor', 'integer', (c) => c.check(sql`price_minor >= 0`))
    .addColumn('sale_unit', 'text', (c) => c.notNull().defaultTo('each'))
    .addColumn('reorder_point', 'integer', (c) => c.notNull().defaultTo(0).check(sql`reorder_point >= 0`))
    .addColumn('notes', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('archived_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint('parts_space_sku_uq', ['space_id', 'sku'])
    .execute();
  await db.schema.createIndex('parts_space_category_idx').on('parts').columns(['space_id', 'category']).execute();
  await sql`create index parts_space_name_idx on parts (space_id, lower(name))`.execute(db);

  // Counted stock: quantity per part per location; never negative.
  await db.schema
    .createTable('stock')
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('part_id', 'uuid', (c) => c.notNull().references('parts.id').onDelete('cascade'))
    .addColumn('location_id', 'uuid', (c) => c.notNull().references('locations.id').onDelete('restrict'))
    .addColumn('qty', 'integer', (c) => c.notNull().defaultTo(0).check(sql`qty >= 0`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('stock_pk', ['part_id', 'location_id'])
    .execute();
  await db.schema.createIndex('stock_space_idx').on('stock').column('space_id').execute();

  // Individually labelled things: each supply, driver board, meter.
  await db.schema
    .createTable('units')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('part_id', 'uuid', (c) => c.notNull().references('parts.id').onDelete('cascade'))
    .addColumn('code', 'text', (c) => c.notNull().unique().references('label_codes.code'))
    .addColumn('serial', 'text')
    .addColumn('state', 'text', (c) => c.notNull().defaultTo('on_shelf').check(UNIT_STATES))
    .addColumn('location_id', 'uuid', (c) => c.references('locations.id').onDelete('set null'))
    .addColumn('kit_box_id', 'uuid')
    .addColumn('notes', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('units_part_idx').on('units').columns(['part_id', 'state']).execute();
  await db.schema.createIndex('units_space_state_idx').on('units').columns(['space_id', 'state']).execute();

  await db.schema
    .createTable('kit_templates')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('description', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('teaching_notes', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('cautions', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('archived_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint('kit_templates_space_name_uq', ['space_id', 'name'])
    .execute();

  // chain_role marks the lines that form the electrical chain for the check.
  await db.schema
    .createTable('kit_template_lines')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('template_id', 'uuid', (c) => c.notNull().references('kit_templates.id').onDelete('cascade'))
    .addColumn('part_id', 'uuid', (c) => c.notNull().references('parts.id').onDelete('restrict'))
    .addColumn('qty', 'integer', (c) => c.notNull().defaultTo(1).check(sql`qty > 0`))
    .addColumn('chain_role', 'text', (c) => c.check(sql`chain_role in ('supply','driver','led','wire')`))
    .addColumn('position', 'integer', (c) => c.notNull().defaultTo(0))
    .execute();

  await db.schema
    .createTable('kit_boxes')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('template_id', 'uuid', (c) => c.notNull().references('kit_templates.id').onDelete('restrict'))
    .addColumn('code', 'text', (c) => c.notNull().unique().references('label_codes.code'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('state', 'text', (c) => c.notNull().defaultTo('on_shelf').check(UNIT_STATES))
    .addColumn('location_id', 'uuid', (c) => c.references('locations.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`alter table units add constraint units_kit_box_fk foreign key (kit_box_id) references kit_boxes(id) on delete set null`.execute(db);

  // What is in a box: a labelled unit, or a quantity of a counted part.
  await db.schema
    .createTable('kit_box_contents')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('kit_box_id', 'uuid', (c) => c.notNull().references('kit_boxes.id').onDelete('cascade'))
    .addColumn('part_id', 'uuid', (c) => c.notNull().references('parts.id').onDelete('restrict'))
    .addColumn('unit_id', 'uuid', (c) => c.references('units.id').onDelete('set null'))
    .addColumn('qty', 'integer', (c) => c.notNull().defaultTo(1).check(sql`qty > 0`))
    .addColumn('chain_role', 'text', (c) => c.check(sql`chain_role in ('supply','driver','led','wire')`))
    .execute();

  // Loan state: out | returned | returned_short; "overdue" is out with due_at in the past.
  await db.schema
    .createTable('loans')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('borrower_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('restrict'))
    .addColumn('lent_by_id', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('kit_box_id', 'uuid', (c) => c.references('kit_boxes.id').onDelete('set null'))
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('out').check(sql`status in ('out','returned','returned_short')`))
    .addColumn('out_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('due_at', 'timestamptz', (c) => c.notNull())
    .addColumn('returned_at', 'timestamptz')
    .addColumn('renewals', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('check_verdict', 'text', (c) => c.check(sql`check_verdict in ('ok','caution','fail')`))
    .addColumn('check_report', 'jsonb')
    .addColumn('caution_acknowledged', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('override_reason', 'text')
    .addColumn('override_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('loans_space_status_due_idx').on('loans').columns(['space_id', 'status', 'due_at']).execute();
  await db.schema.createIndex('loans_borrower_idx').on('loans').columns(['borrower_id', 'status']).execute();

  await db.schema
    .createTable('loan_lines')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('loan_id', 'uuid', (c) => c.notNull().references('loans.id').onDelete('cascade'))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('part_id', 'uuid', (c) => c.notNull().references('parts.id').onDelete('restrict'))
    .addColumn('unit_id', 'uuid', (c) => c.references('units.id').onDelete('set null'))
    .addColumn('location_id', 'uuid', (c) => c.references('locations.id').onDelete('set null'))
    .addColumn('qty', 'integer', (c) => c.notNull().defaultTo(1).check(sql`qty > 0`))
    .addColumn('chain_role', 'text', (c) => c.check(sql`chain_role in ('supply','driver','led','wire')`))
    .addColumn('returned_qty', 'integer', (c) => c.notNull().defaultTo(0).check(sql`returned_qty >= 0`))
    .addColumn('return_condition', 'text', (c) => c.check(sql`return_condition in ('ok','missing','damaged')`))
    .execute();
  await db.schema.createIndex('loan_lines_loan_idx').on('loan_lines').column('loan_id').execute();
  await db.schema.createIndex('loan_lines_unit_idx').on('loan_lines').column('unit_id').execute();

  await db.schema
    .createTable('holds')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('unit_id', 'uuid', (c) => c.references('units.id').onDelete('cascade'))
    .addColumn('kit_box_id', 'uuid', (c) => c.references('kit_boxes.id').onDelete('cascade'))
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('waiting').check(sql`status in ('waiting','ready','fulfilled','cancelled')`))
    .addColumn('notified_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint('holds_one_target', sql`(unit_id is null) <> (kit_box_id is null)`)
    .execute();

  // Each reminder recorded once per (loan, kind, day): a restarted job never sends twice.
  await db.schema
    .createTable('reminders')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('loan_id', 'uuid', (c) => c.notNull().references('loans.id').onDelete('cascade'))
    .addColumn('kind', 'text', (c) => c.notNull().check(sql`kind in ('before_due','due_day','overdue','manual')`))
    .addColumn('for_day', 'date', (c) => c.notNull())
    .addColumn('sent_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('pending').check(sql`status in ('pending','sent','failed')`))
    .addColumn('sent_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`create unique index reminders_once_uq on reminders (loan_id, kind, for_day) where kind <> 'manual'`.execute(db);

  await db.schema
    .createTable('sales')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('buyer_id', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('cashier_id', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('method', 'text', (c) => c.notNull().check(sql`method in ('card','cash')`))
    .addColumn('status', 'text', (c) =>
      c.notNull().defaultTo('pending').check(sql`status in ('pending','paid','failed','expired','refunded','partially_refunded','reversed')`),
    )
    .addColumn('currency', 'char(3)', (c) => c.notNull())
    .addColumn('total_minor', 'integer', (c) => c.notNull().check(sql`total_minor >= 0`))
    .addColumn('checkout_session_id', 'text', (c) => c.unique())
    .addColumn('payment_intent_id', 'text')
    .addColumn('reverses_sale_id', 'uuid', (c) => c.references('sales.id'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('paid_at', 'timestamptz')
    .addColumn('expires_at', 'timestamptz')
    .execute();
  await db.schema.createIndex('sales_space_created_idx').on('sales').columns(['space_id', 'created_at']).execute();
  await db.schema.createIndex('sales_payment_intent_idx').on('sales').column('payment_intent_id').execute();

  await db.schema
    .createTable('sale_lines')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('sale_id', 'uuid', (c) => c.notNull().references('sales.id').onDelete('cascade'))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('part_id', 'uuid', (c) => c.notNull().references('parts.id').onDelete('restrict'))
    .addColumn('location_id', 'uuid', (c) => c.references('locations.id').onDelete('set null'))
    .addColumn('qty', 'integer', (c) => c.notNull().check(sql`qty > 0`))
    .addColumn('unit_price_minor', 'integer', (c) => c.notNull().check(sql`unit_price_minor >= 0`))
    .addColumn('refunded_qty', 'integer', (c) => c.notNull().defaultTo(0).check(sql`refunded_qty >= 0 and refunded_qty <= qty`))
    .execute();

  await db.schema
    .createTable('refunds')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('sale_id', 'uuid', (c) => c.notNull().references('sales.id').onDelete('cascade'))
    .addColumn('amount_minor', 'integer', (c) => c.notNull().check(sql`amount_minor > 0`))
    .addColumn('processor_refund_id', 'text', (c) => c.unique())
    .addColumn('restock', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('lines', 'jsonb', (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  // Each processor event applied once, whatever the order and however many deliveries.
  await db.schema
    .createTable('payment_events')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('type', 'text', (c) => c.notNull())
    .addColumn('space_id', 'uuid', (c) => c.references('spaces.id').onDelete('cascade'))
    .addColumn('object_id', 'text')
    .addColumn('created', 'timestamptz', (c) => c.notNull())
    .addColumn('payload', 'jsonb', (c) => c.notNull())
    .addColumn('received_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('outcome', 'text', (c) => c.notNull().defaultTo('applied'))
    .execute();

  // Closed reconciliation periods: their sales change only by reversing entries.
  await db.schema
    .createTable('closed_periods')
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('month', 'date', (c) => c.notNull())
    .addColumn('closed_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('closed_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('summary', 'jsonb', (c) => c.notNull().defaultTo(sql`'{}'::jsonb`))
    .addPrimaryKeyConstraint('closed_periods_pk', ['space_id', 'month'])
    .execute();

  await db.schema
    .createTable('stock_movements')
    .addColumn('id', 'bigserial', (c) => c.primaryKey())
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('part_id', 'uuid', (c) => c.notNull().references('parts.id').onDelete('cascade'))
    .addColumn('location_id', 'uuid', (c) => c.references('locations.id').onDelete('set null'))
    .addColumn('unit_id', 'uuid', (c) => c.references('units.id').onDelete('set null'))
    .addColumn('qty_delta', 'integer', (c) => c.notNull())
    .addColumn('reason', 'text', (c) =>
      c.notNull().check(
        sql`reason in ('receive','move_in','move_out','adjust','count','loan_out','loan_return','lost','damaged','repair','retire','sale','refund','kit_build')`,
      ),
    )
    .addColumn('ref_type', 'text')
    .addColumn('ref_id', 'text')
    .addColumn('note', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('actor_id', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('stock_movements_part_idx').on('stock_movements').columns(['part_id', 'created_at']).execute();
  await db.schema.createIndex('stock_movements_ref_idx').on('stock_movements').columns(['ref_type', 'ref_id']).execute();

  await db.schema
    .createTable('stock_counts')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('location_id', 'uuid', (c) => c.notNull().references('locations.id').onDelete('cascade'))
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('open').check(sql`status in ('open','posted','abandoned')`))
    .addColumn('lines', 'jsonb', (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('posted_at', 'timestamptz')
    .execute();

  await db.schema
    .createTable('attachments')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('space_id', 'uuid', (c) => c.notNull().references('spaces.id').onDelete('cascade'))
    .addColumn('part_id', 'uuid', (c) => c.notNull().references('parts.id').onDelete('cascade'))
    .addColumn('filename', 'text', (c) => c.notNull())
    .addColumn('mime', 'text', (c) => c.notNull())
    .addColumn('size_bytes', 'integer', (c) => c.notNull().check(sql`size_bytes > 0`))
    .addColumn('sha256', 'text', (c) => c.notNull())
    .addColumn('data', 'bytea', (c) => c.notNull())
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('attachments_part_idx').on('attachments').column('part_id').execute();

  await db.schema
    .createTable('audit_log')
    .addColumn('id', 'bigserial', (c) => c.primaryKey())
    .addColumn('space_id', 'uuid', (c) => c.references('spaces.id').onDelete('cascade'))
    .addColumn('actor_id', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('action', 'text', (c) => c.notNull())
    .addColumn('target_type', 'text')
    .addColumn('target_id', 'text')
    .addColumn('detail', 'jsonb', (c) => c.notNull().defaultTo(sql`'{}'::jsonb`))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  // Sign-in attempts, in the layout rate-limiter-flexible's PostgreSQL store expects.
  await sql`create table rate_limits (key varchar(255) primary key, points integer not null default 0, expire bigint)`.execute(db);

  await db.schema.createIndex('audit_log_space_created_idx').on('audit_log').columns(['space_id', 'created_at']).execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  for (const table of [
    'rate_limits', 'audit_log', 'attachments', 'stock_counts', 'stock_movements', 'closed_periods', 'payment_events', 'refunds',
    'sale_lines', 'sales', 'reminders', 'holds', 'loan_lines', 'loans', 'kit_box_contents', 'units', 'kit_boxes',
    'kit_template_lines', 'kit_templates', 'stock', 'parts', 'locations', 'label_codes', 'sign_in_tokens',
    'invitations', 'memberships', 'users', 'spaces',
  ]) {
    await db.schema.dropTable(table).ifExists().cascade().execute();
  }
}
