import { sql, type Kysely } from 'kysely';

// Units of measure (issue 13). A part is counted and sold in one of our own small set of units:
// 'each' (whole items), 'metre' (wire off the reel) or 'gram' (solder off the spool). The column that
// already said what a part is sold by, parts.sale_unit (free text until now), becomes that unit:
// words that meant a length or a weight are read as 'metre' / 'gram', anything else as 'each', and a
// word that was neither is kept in the part's notes so nothing typed is lost.
//
// The quantities of counted stock become numeric(12,3) (at most three decimals: a millimetre of wire,
// a milligram of solder): the shelf (stock), its movements (write-offs and count variances included),
// sale lines and what was refunded of them, and an order's pack sizes, what arrived and the receipt
// lines. Loans and kit boxes still move whole items. Every existing integer converts exactly; the
// tables' check constraints stay as they were (they compare numbers, whatever their type).

const METRE_WORDS = ['m', 'metre', 'metres', 'meter', 'meters', 'per metre', 'per meter'];
const GRAM_WORDS = ['g', 'gram', 'grams', 'gramme', 'grammes', 'per gram'];

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    update parts set notes = btrim(notes || chr(10) || 'Sold per: ' || sale_unit)
    where lower(btrim(sale_unit)) not in ('each', ${sql.join(METRE_WORDS)}, ${sql.join(GRAM_WORDS)})`.execute(db);
  await sql`
    update parts set sale_unit = case
      when lower(btrim(sale_unit)) in (${sql.join(METRE_WORDS)}) then 'metre'
      when lower(btrim(sale_unit)) in (${sql.join(GRAM_WORDS)}) then 'gram'
      else 'each' end`.execute(db);
  // A labelled unit is one thing on its own label: always 'each'.
  await sql`update parts set sale_unit = 'each' where tracking = 'unit'`.execute(db);
  await sql`
    alter table parts
      add constraint parts_sale_unit_ck check (sale_unit in ('each', 'metre', 'gram')),
      add constraint parts_unit_each_ck check (tracking = 'counted' or sale_unit = 'each')`.execute(db);

  await sql`alter table stock alter column qty type numeric(12,3)`.execute(db);
  await sql`alter table stock_movements alter column qty_delta type numeric(12,3)`.execute(db);
  await sql`
    alter table sale_lines
      alter column qty type numeric(12,3),
      alter column refunded_qty type numeric(12,3)`.execute(db);
  await sql`alter table supplier_offers alter column pack_size type numeric(12,3)`.execute(db);
  await sql`
    alter table order_lines
      alter column pack_size type numeric(12,3),
      alter column received_units type numeric(12,3)`.execute(db);
  await sql`alter table order_receipt_lines alter column units type numeric(12,3)`.execute(db);
  // "At least one" was the whole-number way of saying "more than nothing".
  await sql`alter table order_receipt_lines drop constraint if exists order_receipt_lines_units_check`.execute(db);
  await sql`alter table order_receipt_lines add constraint order_receipt_lines_units_check check (units > 0)`.execute(db);
  await sql`alter table supplier_offers drop constraint if exists supplier_offers_pack_size_check`.execute(db);
  await sql`alter table supplier_offers add constraint supplier_offers_pack_size_check check (pack_size > 0 and pack_size <= 100000)`.execute(db);
  await sql`alter table order_lines drop constraint if exists order_lines_pack_size_check`.execute(db);
  await sql`alter table order_lines add constraint order_lines_pack_size_check check (pack_size > 0 and pack_size <= 100000)`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  // Going back rounds any fraction (half away from zero, PostgreSQL's numeric → integer cast).
  await sql`alter table order_lines drop constraint if exists order_lines_pack_size_check`.execute(db);
  await sql`alter table supplier_offers drop constraint if exists supplier_offers_pack_size_check`.execute(db);
  await sql`alter table order_receipt_lines drop constraint if exists order_receipt_lines_units_check`.execute(db);
  await sql`alter table order_receipt_lines alter column units type integer using greatest(round(units), 1)`.execute(db);
  await sql`alter table order_receipt_lines add constraint order_receipt_lines_units_check check (units >= 1)`.execute(db);
  await sql`
    alter table order_lines
      alter column pack_size type integer using greatest(round(pack_size), 1),
      alter column received_units type integer using round(received_units)`.execute(db);
  await sql`alter table order_lines add constraint order_lines_pack_size_check check (pack_size between 1 and 100000)`.execute(db);
  await sql`alter table supplier_offers alter column pack_size type integer using greatest(round(pack_size), 1)`.execute(db);
  await sql`alter table supplier_offers add constraint supplier_offers_pack_size_check check (pack_size between 1 and 100000)`.execute(db);
  await sql`
    alter table sale_lines
      alter column qty type integer using greatest(round(qty), 1),
      alter column refunded_qty type integer using least(round(refunded_qty), greatest(round(qty), 1))`.execute(db);
  await sql`alter table stock_movements alter column qty_delta type integer using round(qty_delta)`.execute(db);
  await sql`alter table stock alter column qty type integer using round(qty)`.execute(db);
  await sql`alter table parts drop constraint if exists parts_unit_each_ck, drop constraint if exists parts_sale_unit_ck`.execute(db);
}
