// The domain's words, shared by the database types, the services and the UI. Components import these
// from here, never from db/ (a lint rule keeps it so).
export type Role = 'member' | 'steward' | 'treasurer' | 'admin';
export type UnitState = 'on_shelf' | 'out' | 'held' | 'in_repair' | 'retired';
export type PartCategory =
  | 'driver' | 'led' | 'supply' | 'heat_sink' | 'wire' | 'kit_box' | 'tool' | 'meter' | 'consumable' | 'other';
export type ChainRole = 'supply' | 'driver' | 'led' | 'wire';
export type LabelKind = 'unit' | 'part' | 'location' | 'kit_box';
/** waiting: at the bench until a steward hands it over; back_unchecked: returned by the member, not yet checked (bench hand-over, issue 16). */
export type LoanStatus = 'waiting' | 'out' | 'back_unchecked' | 'returned' | 'returned_short' | 'cancelled';
/** Order list states (restocking, migration 0012): draft, with the supplier, part arrived, all arrived, called off. */
export type OrderState = 'draft' | 'sent' | 'part_in' | 'all_in' | 'called_off';
/** How a space's shelf prices carry tax (issue 13): none, already inside the price, or added at the total. */
export type TaxMode = 'exempt' | 'inclusive' | 'exclusive';
/** What a counted part is counted and sold in (migration 0014): whole items, metres or grams. */
export type Measure = 'each' | 'metre' | 'gram';
export type SaleStatus = 'pending' | 'paid' | 'failed' | 'expired' | 'refunded' | 'partially_refunded' | 'reversed';
export type MovementReason =
  | 'receive' | 'move_in' | 'move_out' | 'adjust' | 'count' | 'loan_out' | 'loan_return' | 'lost' | 'damaged'
  | 'repair' | 'retire' | 'sale' | 'refund' | 'kit_build';

/** What each part does in a build, in the words a member reads (never the stored role names). */
export const CHAIN_ROLE_WORDS: Record<ChainRole, string> = {
  supply: 'powers the build',
  driver: 'drives the LEDs',
  led: 'the LEDs that light',
  wire: 'wires the build together',
};

/** A stored chain role (typed loosely in some reads) in a member's words. */
export function chainRoleWords(role: string): string {
  return role in CHAIN_ROLE_WORDS ? CHAIN_ROLE_WORDS[role as ChainRole] : role;
}
