import { roundQty } from '@/lib/inventory/measure';

// What to order: a pure function from the shelf's figures and the suppliers' offers to order lines,
// grouped by supplier. No I/O; lib/restock/to-order-query.ts gathers the figures.
//
// Per part (all quantities in the part's own units):
//   lead-time demand  D = ceil(sold90 × leadDays / 90)
//       the average daily sales of the last 90 days times the supplier's lead time in days: the demand
//       a reorder point must cover while an order is on its way (reorder point = daily demand × lead
//       time — common practice (no source)). Rounded up so a part that sells at all is never projected
//       to sell nothing.
//   unmet holds       H = max(0, waitingHolds − onHand)   (members waiting that the shelf cannot serve)
//   short             S = reorderPoint + D + H − onHand − onOrder
//   packs             P = ceil(S / packSize)   when S > 0, else the part is not listed
// onHand is counted stock over every bin plus labelled units on the shelf (as the Shelf counts it);
// onOrder is what sent order lists still expect. A part without an offer is listed with a pack of one
// and no price, under "no supplier yet".

export type OfferIn = {
  offerId: string;
  supplierId: string;
  supplierName: string;
  leadDays: number;
  minOrderMinor: number;
  itemRef: string;
  packSize: number;
  packPriceMinor: number;
  preferred: boolean;
};

export type PartIn = {
  partId: string;
  name: string;
  sku: string;
  saleUnit: string;
  onHand: number;
  reorderPoint: number;
  waitingHolds: number;
  onOrder: number;
  /** Units sold (less units refunded) over the last 90 days. */
  sold90: number;
  offers: OfferIn[];
};

export type Reason = 'below' | 'holds' | 'sales';

export type ToOrderLine = {
  partId: string;
  name: string;
  sku: string;
  saleUnit: string;
  onHand: number;
  onOrder: number;
  reorderPoint: number;
  leadDemand: number;
  unmetHolds: number;
  short: number;
  reasons: Reason[];
  offerId: string | null;
  itemRef: string;
  packSize: number;
  packs: number;
  units: number;
  packPriceMinor: number | null;
  lineTotalMinor: number;
};

export type ToOrderGroup = {
  supplierId: string | null;
  supplierName: string;
  leadDays: number;
  minOrderMinor: number;
  lines: ToOrderLine[];
  totalMinor: number;
  belowMinimum: boolean;
};

export type ToOrder = { groups: ToOrderGroup[]; totalMinor: number; lineCount: number };

export const SALES_WINDOW_DAYS = 90;

/** Ceiling of a / b for non-negative integers, without floating point. */
const ceilDiv = (a: number, b: number) => Math.floor((a + b - 1) / b);
/** Metres and grams carry up to three decimals (migration 0014): quantities are compared in thousandths. */
const milli = (x: number) => Math.round(x * 1000);

/** The offer an order uses: the preferred one, else the lowest price per unit (ties: the smaller pack). */
export function chooseOffer(offers: OfferIn[]): OfferIn | null {
  const preferred = offers.find((o) => o.preferred);
  if (preferred) return preferred;
  return (
    [...offers].sort(
      (a, b) =>
        a.packPriceMinor * b.packSize - b.packPriceMinor * a.packSize || a.packSize - b.packSize || a.supplierName.localeCompare(b.supplierName),
    )[0] ?? null
  );
}

/** Demand over the lead time from the last 90 days' sales, rounded up (see the header). */
export const leadTimeDemand = (sold90: number, leadDays: number) =>
  sold90 <= 0 || leadDays <= 0 ? 0 : ceilDiv(milli(sold90) * leadDays, SALES_WINDOW_DAYS * 1000);

export function lineFor(part: PartIn): ToOrderLine | null {
  const offer = chooseOffer(part.offers);
  const leadDays = offer?.leadDays ?? 0;
  const leadDemand = leadTimeDemand(part.sold90, leadDays);
  const unmetHolds = Math.max(0, Math.ceil(roundQty(part.waitingHolds - part.onHand)));
  const short = roundQty(part.reorderPoint + leadDemand + unmetHolds - part.onHand - part.onOrder);
  if (short <= 0) return null;
  const reasons: Reason[] = [];
  if (part.onHand < part.reorderPoint) reasons.push('below');
  if (unmetHolds > 0) reasons.push('holds');
  if (leadDemand > 0) reasons.push('sales');
  const packSize = offer?.packSize ?? 1;
  const packs = ceilDiv(milli(short), milli(packSize));
  return {
    partId: part.partId,
    name: part.name,
    sku: part.sku,
    saleUnit: part.saleUnit,
    onHand: part.onHand,
    onOrder: part.onOrder,
    reorderPoint: part.reorderPoint,
    leadDemand,
    unmetHolds,
    short,
    reasons,
    offerId: offer?.offerId ?? null,
    itemRef: offer?.itemRef ?? '',
    packSize,
    packs,
    units: roundQty(packs * packSize),
    packPriceMinor: offer ? offer.packPriceMinor : null,
    lineTotalMinor: offer ? packs * offer.packPriceMinor : 0,
  };
}

/** Every part that needs ordering, grouped by the supplier of its chosen offer; "no supplier yet" last. */
export function toOrder(parts: PartIn[]): ToOrder {
  const groups = new Map<string, ToOrderGroup>();
  for (const part of parts) {
    const line = lineFor(part);
    if (!line) continue;
    const offer = chooseOffer(part.offers);
    const key = offer?.supplierId ?? '';
    let g = groups.get(key);
    if (!g) {
      g = {
        supplierId: offer?.supplierId ?? null,
        supplierName: offer?.supplierName ?? 'No supplier yet',
        leadDays: offer?.leadDays ?? 0,
        minOrderMinor: offer?.minOrderMinor ?? 0,
        lines: [],
        totalMinor: 0,
        belowMinimum: false,
      };
      groups.set(key, g);
    }
    g.lines.push(line);
    g.totalMinor += line.lineTotalMinor;
  }
  const list = [...groups.values()];
  for (const g of list) {
    g.lines.sort((a, b) => a.name.localeCompare(b.name));
    g.belowMinimum = g.supplierId !== null && g.totalMinor < g.minOrderMinor;
  }
  list.sort((a, b) => (a.supplierId === null ? 1 : b.supplierId === null ? -1 : a.supplierName.localeCompare(b.supplierName)));
  return {
    groups: list,
    totalMinor: list.reduce((n, g) => n + g.totalMinor, 0),
    lineCount: list.reduce((n, g) => n + g.lines.length, 0),
  };
}

export const REASON_WORDS: Record<Reason, string> = {
  below: 'below its reorder point',
  holds: 'members waiting that the shelf cannot serve',
  sales: 'sales over the last 90 days would take it below its reorder point before a delivery',
};
