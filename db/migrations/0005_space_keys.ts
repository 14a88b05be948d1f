import { sql, type Kysely } from 'kysely';

// Tenancy in the schema. Every row a space owns carries space_id, and every reference from one
// space-owned row to another goes through (space_id, id): a row cannot point at another space's row,
// whatever the code above forgets. The same keys are what a database distributed by space_id needs to
// keep one space's rows together (README, Scale).
//
// 1. kit_template_lines and kit_box_contents get space_id, copied from their template and box.
// 2. Each referenced table gets a unique index on (space_id, id) (label_codes: (space_id, code)).
//    `create unique index if not exists <table>_space_id_id_uq` is the one statement for this, so a later
//    migration adding a table can run it again for a parent without a clash.
// 3. Each single-column foreign key between space-owned tables becomes composite, under its old name and
//    with its old on-delete rule; "set null" names the id column only (PostgreSQL 15), so space_id stays.

type Fk = {
  table: string;
  column: string;
  parent: string;
  parentColumn?: string; // 'id' unless said
  onDelete?: 'cascade' | 'restrict' | 'set null';
  name?: string; // `${table}_${column}_fkey` unless said
};

/** Every foreign key from a space-owned table to another, as 0001 made it. */
const SPACE_FKS: Fk[] = [
  { table: 'locations', column: 'code', parent: 'label_codes', parentColumn: 'code' },
  { table: 'locations', column: 'parent_id', parent: 'locations', onDelete: 'set null' },
  { table: 'parts', column: 'code', parent: 'label_codes', parentColumn: 'code' },
  { table: 'stock', column: 'part_id', parent: 'parts', onDelete: 'cascade' },
  { table: 'stock', column: 'location_id', parent: 'locations', onDelete: 'restrict' },
  { table: 'units', column: 'part_id', parent: 'parts', onDelete: 'cascade' },
  { table: 'units', column: 'code', parent: 'label_codes', parentColumn: 'code' },
  { table: 'units', column: 'location_id', parent: 'locations', onDelete: 'set null' },
  { table: 'units', column: 'kit_box_id', parent: 'kit_boxes', onDelete: 'set null', name: 'units_kit_box_fk' },
  { table: 'kit_template_lines', column: 'template_id', parent: 'kit_templates', onDelete: 'cascade' },
  { table: 'kit_template_lines', column: 'part_id', parent: 'parts', onDelete: 'restrict' },
  { table: 'kit_boxes', column: 'template_id', parent: 'kit_templates', onDelete: 'restrict' },
  { table: 'kit_boxes', column: 'code', parent: 'label_codes', parentColumn: 'code' },
  { table: 'kit_boxes', column: 'location_id', parent: 'locations', onDelete: 'set null' },
  { table: 'kit_box_contents', column: 'kit_box_id', parent: 'kit_boxes', onDelete: 'cascade' },
  { table: 'kit_box_contents', column: 'part_id', parent: 'parts', onDelete: 'restrict' },
  { table: 'kit_box_contents', column: 'unit_id', parent: 'units', onDelete: 'set null' },
  { table: 'loans', column: 'kit_box_id', parent: 'kit_boxes', onDelete: 'set null' },
  { table: 'loan_lines', column: 'loan_id', parent: 'loans', onDelete: 'cascade' },
  { table: 'loan_lines', column: 'part_id', parent: 'parts', onDelete: 'restrict' },
  { table: 'loan_lines', column: 'unit_id', parent: 'units', onDelete: 'set null' },
  { table: 'loan_lines', column: 'location_id', parent: 'locations', onDelete: 'set null' },
  { table: 'holds', column: 'unit_id', parent: 'units', onDelete: 'cascade' },
  { table: 'holds', column: 'kit_box_id', parent: 'kit_boxes', onDelete: 'cascade' },
  { table: 'reminders', column: 'loan_id', parent: 'loans', onDelete: 'cascade' },
  { table: 'sales', column: 'reverses_sale_id', parent: 'sales' },
  { table: 'sale_lines', column: 'sale_id', parent: 'sales', onDelete: 'cascade' },
  { table: 'sale_lines', column: 'part_id', parent: 'parts', onDelete: 'restrict' },
  { table: 'sale_lines', column: 'location_id', parent: 'locations', onDelete: 'set null' },
  { table: 'refunds', column: 'sale_id', parent: 'sales', onDelete: 'cascade' },
  { table: 'stock_movements', column: 'part_id', parent: 'parts', onDelete: 'cascade' },
  { table: 'stock_movements', column: 'location_id', parent: 'locations', onDelete: 'set null' },
  { table: 'stock_movements', column: 'unit_id', parent: 'units', onDelete: 'set null' },
  { table: 'stock_counts', column: 'location_id', parent: 'locations', onDelete: 'cascade' },
  { table: 'attachments', column: 'part_id', parent: 'parts', onDelete: 'cascade' },
];

/** The child tables that had no space_id, and the parent each takes it from. */
const NEW_SPACE_ID = [
  { table: 'kit_template_lines', via: 'template_id', parent: 'kit_templates' },
  { table: 'kit_box_contents', via: 'kit_box_id', parent: 'kit_boxes' },
] as const;

const fkName = (fk: Fk) => fk.name ?? `${fk.table}_${fk.column}_fkey`;
const parentKey = (fk: Fk) => fk.parentColumn ?? 'id';
const uniqueName = (parent: string, key: string) => `${parent}_space_id_${key}_uq`;

function onDelete(fk: Fk, composite: boolean) {
  if (!fk.onDelete) return sql``;
  if (fk.onDelete === 'set null' && composite) return sql` on delete set null (${sql.ref(fk.column)})`;
  return sql.raw(` on delete ${fk.onDelete}`);
}

export async function up(db: Kysely<unknown>): Promise<void> {
  for (const t of NEW_SPACE_ID) {
    await sql`alter table ${sql.table(t.table)} add column space_id uuid`.execute(db);
    await sql`update ${sql.table(t.table)} c set space_id = p.space_id
              from ${sql.table(t.parent)} p where p.id = c.${sql.ref(t.via)}`.execute(db);
    await sql`alter table ${sql.table(t.table)} alter column space_id set not null`.execute(db);
    await sql`alter table ${sql.table(t.table)} add constraint ${sql.id(`${t.table}_space_id_fkey`)}
              foreign key (space_id) references spaces (id) on delete cascade`.execute(db);
  }

  const parents = new Map<string, string>();
  for (const fk of SPACE_FKS) parents.set(fk.parent, parentKey(fk));
  for (const [parent, key] of parents)
    await sql`create unique index if not exists ${sql.id(uniqueName(parent, key))}
              on ${sql.table(parent)} (space_id, ${sql.ref(key)})`.execute(db);

  for (const fk of SPACE_FKS) {
    await sql`alter table ${sql.table(fk.table)} drop constraint ${sql.id(fkName(fk))}`.execute(db);
    await sql`alter table ${sql.table(fk.table)} add constraint ${sql.id(fkName(fk))}
              foreign key (space_id, ${sql.ref(fk.column)})
              references ${sql.table(fk.parent)} (space_id, ${sql.ref(parentKey(fk))})${onDelete(fk, true)}`.execute(db);
  }

  // The composite keys lead with space_id; these lookups by the child's own id column keep their index.
  await sql`create index if not exists kit_template_lines_template_idx on kit_template_lines (template_id)`.execute(db);
  await sql`create index if not exists kit_box_contents_box_idx on kit_box_contents (kit_box_id)`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`drop index if exists kit_box_contents_box_idx`.execute(db);
  await sql`drop index if exists kit_template_lines_template_idx`.execute(db);
  for (const fk of SPACE_FKS) {
    await sql`alter table ${sql.table(fk.table)} drop constraint ${sql.id(fkName(fk))}`.execute(db);
    await sql`alter table ${sql.table(fk.table)} add constraint ${sql.id(fkName(fk))}
              foreign key (${sql.ref(fk.column)})
              references ${sql.table(fk.parent)} (${sql.ref(parentKey(fk))})${onDelete(fk, false)}`.execute(db);
  }
  const parents = new Map<string, string>();
  for (const fk of SPACE_FKS) parents.set(fk.parent, parentKey(fk));
  for (const [parent, key] of parents) await sql`drop index if exists ${sql.id(uniqueName(parent, key))}`.execute(db);
  for (const t of NEW_SPACE_ID) await sql`alter table ${sql.table(t.table)} drop column space_id`.execute(db);
}
