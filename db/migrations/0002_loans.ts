import { sql, type Kysely } from 'kysely';

// Kits and loans: a private calendar-feed token per person, one open hold per person and item, and the
// indexes the hold queue and the reminder sweep read.

export async function up(db: Kysely<unknown>): Promise<void> {
  // Secret part of the person's iCalendar feed URL; made on first use, replaced to revoke an old link.
  await db.schema.alterTable('users').addColumn('calendar_token', 'text', (c) => c.unique()).execute();

  // Someone can wait for a given box or unit only once at a time (a double click makes one hold).
  await sql`create unique index holds_one_open_uq on holds (user_id, coalesce(unit_id, kit_box_id))
            where status in ('waiting', 'ready')`.execute(db);
  // The queue for an item: oldest waiting hold first.
  await sql`create index holds_box_queue_idx on holds (kit_box_id, created_at) where status in ('waiting', 'ready')`.execute(db);
  await sql`create index holds_unit_queue_idx on holds (unit_id, created_at) where status in ('waiting', 'ready')`.execute(db);
  // Reminders a crashed sweep left half done.
  await sql`create index reminders_pending_idx on reminders (created_at) where status = 'pending'`.execute(db);
  await sql`create index loans_kit_box_idx on loans (kit_box_id) where status = 'out'`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`drop index if exists loans_kit_box_idx`.execute(db);
  await sql`drop index if exists reminders_pending_idx`.execute(db);
  await sql`drop index if exists holds_unit_queue_idx`.execute(db);
  await sql`drop index if exists holds_box_queue_idx`.execute(db);
  await sql`drop index if exists holds_one_open_uq`.execute(db);
  await db.schema.alterTable('users').dropColumn('calendar_token').execute();
}
