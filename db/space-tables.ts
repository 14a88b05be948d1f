import type { Database } from './types';

// Every table a space owns: each has a space_id column (tests/integration/tenancy-schema.test.ts compares
// this list with the database's catalog, so a new table with space_id must be added here). Queries on
// these tables go through `scoped()` (db/scoped.ts); tests/unit/tenancy/scoped-queries.test.ts refuses
// one that does not.
export const SPACE_TABLES = [
  'memberships',
  'invitations',
  'label_codes',
  'locations',
  'parts',
  'stock',
  'units',
  'kit_templates',
  'kit_template_lines',
  'kit_boxes',
  'kit_box_contents',
  'loans',
  'loan_lines',
  'holds',
  'reminders',
  'sales',
  'sale_lines',
  'refunds',
  'payment_events',
  'closed_periods',
  'stock_movements',
  'stock_counts',
  'attachments',
  'audit_log',
  'recon_resolutions',
  'inductions',
  'kit_template_inductions',
  'category_inductions',
  'induction_signoffs',
  'deposits',
  'charges',
  'suppliers',
  'supplier_offers',
  'order_lists',
  'order_lines',
  'order_receipts',
  'order_receipt_lines',
  'honour_box_counts',
  'honour_box_bankings',
  'charge_payments',
] as const satisfies readonly (keyof Database)[];

export type SpaceTable = (typeof SPACE_TABLES)[number];

/**
 * The tables whose space_id may be null, and why: a processor event is stored before (or without) a sale
 * of ours naming its space, and an account-wide audit line (a sign-in) belongs to no space.
 */
export const NULLABLE_SPACE_ID: readonly SpaceTable[] = ['payment_events', 'audit_log'];

const spaceTableSet: ReadonlySet<string> = new Set(SPACE_TABLES);
export const isSpaceTable = (name: string): name is SpaceTable => spaceTableSet.has(name);
