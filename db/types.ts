import type { ColumnType, Generated, Insertable, Selectable, Updateable } from 'kysely';

// The typed shape of the schema in db/migrations. Keep in step with every migration.
// Insert/update take ISO strings or Dates; JSON columns take JSON.stringify'd text (pg sends it as is).
type Timestamp = ColumnType<Date, Date | string, Date | string>;
type TimestampDefault = ColumnType<Date, Date | string | undefined, Date | string>;
type TimestampNullable = ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
type Json<T = unknown> = ColumnType<T, string, string>;
type JsonDefault<T = unknown> = ColumnType<T, string | undefined, string>;
type JsonNullable<T = unknown> = ColumnType<T | null, string | null | undefined, string | null>;

import type { ChainRole, LabelKind, LoanStatus, Measure, MovementReason, OrderState, PartCategory, Role, SaleStatus, TaxMode, UnitState } from '@/lib/domain';

export type { ChainRole, LabelKind, LoanStatus, Measure, MovementReason, OrderState, PartCategory, Role, SaleStatus, TaxMode, UnitState };

export interface SpacesTable {
  id: Generated<string>;
  slug: string;
  name: string;
  currency: Generated<string>;
  time_zone: Generated<string>;
  loan_days: Generated<number>;
  closing_time: Generated<string>;
  max_open_loans: Generated<number>;
  reminder_days_before: Generated<number>;
  reminder_every_days: Generated<number>;
  label_layout: Generated<string>;
  /** Air temperature at the bench, °C, for the heat check (migration 0003_build_gate). */
  ambient_c: Generated<number>;
  settings: JsonDefault<Record<string, unknown>>;
  created_at: TimestampDefault;
}

export interface UsersTable {
  id: Generated<string>;
  email: string;
  name: string;
  password_hash: string | null;
  /** Account-wide switch for an operator; admins switch access per space (memberships.disabled_at). */
  disabled_at: TimestampNullable;
  last_space_id: string | null;
  /** Secret of the person's iCalendar feed (migration 0002_loans); null until first asked for. */
  calendar_token: ColumnType<string | null, string | null | undefined, string | null>;
  /** When their personal data was erased on request; the row stays as a placeholder (migration 0008). */
  erased_at: TimestampNullable;
  created_at: TimestampDefault;
}

export interface MembershipsTable {
  space_id: string;
  user_id: string;
  roles: Role[];
  /** Access to this space switched off by its admins (migration 0004); other spaces are unaffected. */
  disabled_at: TimestampNullable;
  created_at: TimestampDefault;
}

/** One row per sign-in; the session cookie names it and sign-out ends it (migration 0004). */
export interface AuthSessionsTable {
  id: Generated<string>;
  user_id: string;
  created_at: TimestampDefault;
  expires_at: Timestamp;
  ended_at: TimestampNullable;
}

export interface InvitationsTable {
  id: Generated<string>;
  space_id: string;
  email: string;
  name: string;
  roles: Role[];
  token_hash: string;
  invited_by: string | null;
  expires_at: Timestamp;
  accepted_at: TimestampNullable;
  created_at: TimestampDefault;
}

export interface SignInTokensTable {
  id: Generated<string>;
  user_id: string;
  token_hash: string;
  expires_at: Timestamp;
  used_at: TimestampNullable;
  created_at: TimestampDefault;
}

export interface LabelCodesTable {
  code: string;
  space_id: string;
  kind: LabelKind;
  target_id: string;
  created_at: TimestampDefault;
}

export interface LocationsTable {
  id: Generated<string>;
  space_id: string;
  code: string | null;
  name: string;
  kind: Generated<'bin' | 'shelf' | 'drawer' | 'cabinet' | 'room'>;
  parent_id: string | null;
  created_at: TimestampDefault;
}

export interface PartsTable {
  id: Generated<string>;
  space_id: string;
  sku: string;
  name: string;
  category: PartCategory;
  tracking: 'counted' | 'unit';
  specs: JsonDefault<Record<string, unknown>>;
  code: string | null;
  sellable: Generated<boolean>;
  lendable: Generated<boolean>;
  price_minor: number | null;
  /** The unit of measure (migration 0014); labelled parts are always 'each'. */
  sale_unit: Generated<Measure>;
  reorder_point: Generated<number>;
  notes: Generated<string>;
  archived_at: TimestampNullable;
  created_at: TimestampDefault;
  updated_at: TimestampDefault;
}

export interface StockTable {
  space_id: string;
  part_id: string;
  location_id: string;
  /** numeric(12,3) since migration 0014, read as a number (db/connect.ts). */
  qty: Generated<number>;
  updated_at: TimestampDefault;
}

export interface UnitsTable {
  id: Generated<string>;
  space_id: string;
  part_id: string;
  code: string;
  serial: string | null;
  state: Generated<UnitState>;
  location_id: string | null;
  kit_box_id: string | null;
  notes: Generated<string>;
  created_at: TimestampDefault;
  updated_at: TimestampDefault;
}

export interface KitTemplatesTable {
  id: Generated<string>;
  space_id: string;
  name: string;
  description: Generated<string>;
  teaching_notes: Generated<string>;
  cautions: Generated<string>;
  archived_at: TimestampNullable;
  created_at: TimestampDefault;
  /** A costly kit's deposit in the space's currency, minor units (migration 0011), or null for none. */
  deposit_minor: ColumnType<number | null, number | null | undefined, number | null>;
}

export interface KitTemplateLinesTable {
  id: Generated<string>;
  template_id: string;
  /** Copied from the template (migration 0005_space_keys); the key to its template is (space_id, template_id). */
  space_id: string;
  part_id: string;
  qty: Generated<number>;
  chain_role: ChainRole | null;
  position: Generated<number>;
}

export interface KitBoxesTable {
  id: Generated<string>;
  space_id: string;
  template_id: string;
  code: string;
  name: string;
  state: Generated<UnitState>;
  location_id: string | null;
  created_at: TimestampDefault;
}

export interface KitBoxContentsTable {
  id: Generated<string>;
  kit_box_id: string;
  /** Copied from the box (migration 0005_space_keys); the key to its box is (space_id, kit_box_id). */
  space_id: string;
  part_id: string;
  unit_id: string | null;
  qty: Generated<number>;
  chain_role: ChainRole | null;
}

export interface LoansTable {
  id: Generated<string>;
  space_id: string;
  borrower_id: string;
  lent_by_id: string | null;
  kit_box_id: string | null;
  status: Generated<LoanStatus>;
  out_at: TimestampDefault;
  due_at: Timestamp;
  returned_at: TimestampNullable;
  renewals: Generated<number>;
  check_verdict: 'ok' | 'caution' | 'fail' | null;
  check_report: JsonNullable<unknown>;
  caution_acknowledged: Generated<boolean>;
  override_reason: string | null;
  override_by: string | null;
  /** Parts the borrower described as their own, checked with the loan (migration 0003_build_gate). */
  own_parts: JsonNullable<unknown>;
  created_at: TimestampDefault;
  /** What the steward wrote when checking it back in (migration 0007_box_upkeep). */
  return_note: Generated<string>;
  /** A steward lending although a required sign-off is missing, and why (migration 0006). */
  induction_override_reason: ColumnType<string | null, string | null | undefined, string | null>;
  induction_override_by: ColumnType<string | null, string | null | undefined, string | null>;
  /** Bench hand-over (migration 0006): who handed it over and when; when the member said it was back. */
  handed_over_by: ColumnType<string | null, string | null | undefined, string | null>;
  handed_over_at: TimestampNullable;
  back_reported_at: TimestampNullable;
  back_note: ColumnType<string | null, string | null | undefined, string | null>;
  /** A borrow given up before it became a loan (migration 0011). */
  cancelled_at: TimestampNullable;
}

export interface LoanLinesTable {
  id: Generated<string>;
  loan_id: string;
  space_id: string;
  part_id: string;
  unit_id: string | null;
  location_id: string | null;
  qty: Generated<number>;
  chain_role: ChainRole | null;
  returned_qty: Generated<number>;
  return_condition: 'ok' | 'missing' | 'damaged' | null;
}

export interface HoldsTable {
  id: Generated<string>;
  space_id: string;
  user_id: string;
  unit_id: string | null;
  kit_box_id: string | null;
  status: Generated<'waiting' | 'ready' | 'fulfilled' | 'cancelled'>;
  notified_at: TimestampNullable;
  created_at: TimestampDefault;
}

export interface RemindersTable {
  id: Generated<string>;
  space_id: string;
  loan_id: string;
  kind: 'before_due' | 'due_day' | 'overdue' | 'manual';
  for_day: ColumnType<string, string, string>;
  sent_by: string | null;
  status: Generated<'pending' | 'sent' | 'failed'>;
  sent_at: TimestampNullable;
  created_at: TimestampDefault;
}

export interface SalesTable {
  id: Generated<string>;
  space_id: string;
  buyer_id: string | null;
  cashier_id: string | null;
  method: 'card' | 'cash';
  status: Generated<SaleStatus>;
  currency: string;
  total_minor: number;
  checkout_session_id: string | null;
  payment_intent_id: string | null;
  reverses_sale_id: string | null;
  created_at: TimestampDefault;
  paid_at: TimestampNullable;
  expires_at: TimestampNullable;
  /** The tax the sale was made under, kept so a later rate change never moves it (migration 0013). */
  tax_mode: Generated<TaxMode>;
  /** Hundredths of a percent: 825 is 8.25 %. */
  tax_rate_bp: Generated<number>;
  /** The tax inside total_minor (total_minor is always what the buyer pays). */
  tax_minor: Generated<number>;
  /** counter: rung up at the counter; honour_box: recorded by the buyer themself. */
  channel: Generated<'counter' | 'honour_box'>;
}

export interface SaleLinesTable {
  id: Generated<string>;
  sale_id: string;
  space_id: string;
  part_id: string;
  location_id: string | null;
  /** numeric(12,3): metres or grams may be fractions (migration 0014). */
  qty: number;
  unit_price_minor: number;
  refunded_qty: Generated<number>;
}

export interface RefundsTable {
  id: Generated<string>;
  space_id: string;
  sale_id: string;
  amount_minor: number;
  processor_refund_id: string | null;
  restock: Generated<boolean>;
  lines: JsonDefault<{ saleLineId: string; qty: number }[]>;
  created_by: string | null;
  created_at: TimestampDefault;
  /** The tax inside amount_minor (migration 0013). */
  tax_minor: Generated<number>;
}

/** A steward's count of the honour box: what should be in it against what is (migration 0013). */
export interface HonourBoxCountsTable {
  id: Generated<string>;
  space_id: string;
  currency: string;
  counted_at: Timestamp;
  counted_by: string | null;
  /** The previous count's time; null for the first count. */
  since: TimestampNullable;
  carried_minor: number;
  cash_sales_minor: number;
  cash_refunds_minor: number;
  expected_minor: number;
  counted_minor: number;
  note: Generated<string>;
}

/** Money taken from the box to the bank after a count (one banking per count). */
export interface HonourBoxBankingsTable {
  id: Generated<string>;
  space_id: string;
  count_id: string;
  amount_minor: number;
  reference: Generated<string>;
  banked_at: Timestamp;
  banked_by: string | null;
}

export interface PaymentEventsTable {
  id: string;
  type: string;
  space_id: string | null;
  object_id: string | null;
  created: Timestamp;
  payload: Json<unknown>;
  received_at: TimestampDefault;
  outcome: Generated<string>;
}

export interface ClosedPeriodsTable {
  space_id: string;
  month: ColumnType<string, string, string>;
  closed_by: string | null;
  closed_at: TimestampDefault;
  summary: JsonDefault<Record<string, unknown>>;
}

export interface StockMovementsTable {
  id: Generated<string>;
  space_id: string;
  part_id: string;
  location_id: string | null;
  unit_id: string | null;
  qty_delta: number;
  reason: MovementReason;
  ref_type: string | null;
  ref_id: string | null;
  note: Generated<string>;
  actor_id: string | null;
  created_at: TimestampDefault;
}

export interface StockCountsTable {
  id: Generated<string>;
  space_id: string;
  location_id: string;
  status: Generated<'open' | 'posted' | 'abandoned'>;
  lines: JsonDefault<{ partId: string; expected: number; counted: number | null }[]>;
  created_by: string | null;
  created_at: TimestampDefault;
  posted_at: TimestampNullable;
}

export interface AttachmentsTable {
  id: Generated<string>;
  space_id: string;
  part_id: string;
  filename: string;
  mime: string;
  size_bytes: number;
  sha256: string;
  data: Buffer;
  created_by: string | null;
  created_at: TimestampDefault;
}

export interface AuditLogTable {
  id: Generated<string>;
  space_id: string | null;
  actor_id: string | null;
  action: string;
  target_type: string | null;
  target_id: string | null;
  detail: JsonDefault<Record<string, unknown>>;
  created_at: TimestampDefault;
}

/** A treasurer's note on a reconciliation row that does not match (0010). */
export interface ReconResolutionsTable {
  id: Generated<string>;
  space_id: string;
  month: ColumnType<string, string, string>;
  row_key: string;
  sale_id: string | null;
  note: string;
  written_by: string | null;
  written_at: TimestampDefault;
}

/** Every nightly backup attempt of the installation (migration 0008; no space_id: one dump holds all). */
export interface BackupRunsTable {
  id: Generated<string>;
  taken_at: Timestamp;
  started_at: Timestamp;
  finished_at: Timestamp;
  file: string | null;
  size_bytes: ColumnType<string | null, number | null, number | null>;
  ok: boolean;
  error: string | null;
}

export interface Database {
  spaces: SpacesTable;
  users: UsersTable;
  memberships: MembershipsTable;
  auth_sessions: AuthSessionsTable;
  invitations: InvitationsTable;
  sign_in_tokens: SignInTokensTable;
  label_codes: LabelCodesTable;
  locations: LocationsTable;
  parts: PartsTable;
  stock: StockTable;
  units: UnitsTable;
  kit_templates: KitTemplatesTable;
  kit_template_lines: KitTemplateLinesTable;
  kit_boxes: KitBoxesTable;
  kit_box_contents: KitBoxContentsTable;
  loans: LoansTable;
  loan_lines: LoanLinesTable;
  holds: HoldsTable;
  reminders: RemindersTable;
  sales: SalesTable;
  sale_lines: SaleLinesTable;
  refunds: RefundsTable;
  payment_events: PaymentEventsTable;
  closed_periods: ClosedPeriodsTable;
  stock_movements: StockMovementsTable;
  stock_counts: StockCountsTable;
  attachments: AttachmentsTable;
  audit_log: AuditLogTable;
  recon_resolutions: ReconResolutionsTable;
  honour_box_counts: HonourBoxCountsTable;
  honour_box_bankings: HonourBoxBankingsTable;
  backup_runs: BackupRunsTable;
  // Borrowing rules (migration 0006)
  inductions: InductionsTable;
  kit_template_inductions: KitTemplateInductionsTable;
  category_inductions: CategoryInductionsTable;
  induction_signoffs: InductionSignoffsTable;
  // Deposits and charges (migration 0011)
  deposits: DepositsTable;
  charges: ChargesTable;
  // Restocking (migration 0012)
  suppliers: SuppliersTable;
  supplier_offers: SupplierOffersTable;
  order_lists: OrderListsTable;
  order_lines: OrderLinesTable;
  order_receipts: OrderReceiptsTable;
  order_receipt_lines: OrderReceiptLinesTable;
  // Paying charges (migration 0016)
  charge_payments: ChargePaymentsTable;
}

export type DepositStatus = 'pending' | 'held' | 'releasing' | 'released' | 'ended';

/** A loan's deposit (migration 0011): pending → held → releasing → released, or pending → ended. */
export interface DepositsTable {
  id: Generated<string>;
  space_id: string;
  loan_id: string;
  amount_minor: number;
  currency: string;
  status: Generated<DepositStatus>;
  /** What the loan becomes once the deposit is paid. */
  starts_as: 'out' | 'waiting';
  checkout_session_id: string | null;
  checkout_url: string | null;
  payment_intent_id: string | null;
  paid_at: TimestampNullable;
  kept_minor: Generated<number>;
  released_minor: number | null;
  refund_id: string | null;
  release_started_at: TimestampNullable;
  released_at: TimestampNullable;
  ended_at: TimestampNullable;
  created_at: TimestampDefault;
}

/** What a member owes for a missing or damaged part (migration 0011). */
export interface ChargesTable {
  id: Generated<string>;
  space_id: string;
  user_id: string;
  loan_id: string | null;
  loan_line_id: string | null;
  /** 'late': a late fee (migration 0016), at most one per loan. */
  kind: 'missing' | 'damaged' | 'late';
  item: string;
  note: Generated<string>;
  amount_minor: number;
  currency: string;
  from_deposit_minor: Generated<number>;
  settled_minor: Generated<number>;
  created_by: string | null;
  created_at: TimestampDefault;
}

export type ChargePaymentStatus = 'pending' | 'paid' | 'ended';

/** Money a member paid towards their charges (migration 0016): by card (pending → paid | ended) or cash (paid). */
export interface ChargePaymentsTable {
  id: Generated<string>;
  space_id: string;
  user_id: string;
  method: 'card' | 'cash';
  amount_minor: number;
  currency: string;
  status: Generated<ChargePaymentStatus>;
  checkout_session_id: string | null;
  checkout_url: string | null;
  payment_intent_id: string | null;
  created_by: string | null;
  created_at: TimestampDefault;
  paid_at: TimestampNullable;
  ended_at: TimestampNullable;
}

/** Where a space buys its parts (migration 0012). */
export interface SuppliersTable {
  id: Generated<string>;
  space_id: string;
  name: string;
  website: Generated<string>;
  email: Generated<string>;
  lead_days: Generated<number>;
  min_order_minor: Generated<number>;
  notes: Generated<string>;
  archived_at: TimestampNullable;
  created_at: TimestampDefault;
}

/** What one supplier sells of one part: their reference, pack size and price per pack (minor units). */
export interface SupplierOffersTable {
  id: Generated<string>;
  space_id: string;
  supplier_id: string;
  part_id: string;
  item_ref: Generated<string>;
  pack_size: number;
  pack_price_minor: number;
  preferred: Generated<boolean>;
  created_at: TimestampDefault;
}


/** An order list to one supplier (migration 0012). */
export interface OrderListsTable {
  id: Generated<string>;
  space_id: string;
  supplier_id: string;
  state: Generated<OrderState>;
  currency: string;
  note: Generated<string>;
  created_by: string | null;
  created_at: TimestampDefault;
  sent_at: TimestampNullable;
  sent_by: ColumnType<string | null, string | null | undefined, string | null>;
  expected_at: TimestampNullable;
  approved_at: TimestampNullable;
  approved_by: ColumnType<string | null, string | null | undefined, string | null>;
  approval_note: ColumnType<string | null, string | null | undefined, string | null>;
  closed_at: TimestampNullable;
  cancel_note: ColumnType<string | null, string | null | undefined, string | null>;
}

export interface OrderLinesTable {
  id: Generated<string>;
  space_id: string;
  order_id: string;
  part_id: string;
  item_ref: Generated<string>;
  pack_size: number;
  packs: number;
  pack_price_minor: number;
  /** numeric(12,3), like pack_size (migration 0014). */
  received_units: Generated<number>;
}

export interface OrderReceiptsTable {
  id: Generated<string>;
  space_id: string;
  order_id: string;
  idempotency_key: string;
  received_by: string | null;
  received_at: TimestampDefault;
  result: JsonDefault<Record<string, unknown>>;
}

export interface OrderReceiptLinesTable {
  id: Generated<string>;
  space_id: string;
  receipt_id: string;
  line_id: string;
  part_id: string;
  location_id: string | null;
  units: number;
  cost_minor: number;
}

/** What a space shows a member before they may borrow certain things (migration 0006). */
export interface InductionsTable {
  id: Generated<string>;
  space_id: string;
  name: string;
  description: Generated<string>;
  archived_at: TimestampNullable;
  created_at: TimestampDefault;
}

export interface KitTemplateInductionsTable {
  space_id: string;
  template_id: string;
  induction_id: string;
}

export interface CategoryInductionsTable {
  space_id: string;
  category: PartCategory;
  induction_id: string;
}

/** A steward's word that a member was shown an induction; revoked, never deleted. */
export interface InductionSignoffsTable {
  id: Generated<string>;
  space_id: string;
  induction_id: string;
  user_id: string;
  signed_by: string | null;
  signed_at: TimestampDefault;
  expires_at: TimestampNullable;
  note: Generated<string>;
  revoked_at: TimestampNullable;
  revoked_by: ColumnType<string | null, string | null | undefined, string | null>;
}

export type Space = Selectable<SpacesTable>;
export type User = Selectable<UsersTable>;
export type Part = Selectable<PartsTable>;
export type NewPart = Insertable<PartsTable>;
export type PartUpdate = Updateable<PartsTable>;
export type Unit = Selectable<UnitsTable>;
export type Loan = Selectable<LoansTable>;
export type Sale = Selectable<SalesTable>;
