import type { PartCategory } from '@/lib/domain';
import type { Filing } from './filing';

// The sums of each section of the month's filing file: what the Books page shows for filing and the
// totals file holds. Pure, so the sums are tested by hand (tests/unit/reconcile/filing-csv.test.ts).

export type FilingTotals = {
  cardSalesMinor: number;
  cashSalesMinor: number;
  taxCollectedMinor: number;
  taxRefundedMinor: number;
  cardRefundsMinor: number;
  cashRefundsMinor: number;
  processorFeesMinor: number;
  writeOffLines: number;
  /** Write-offs whose cost is known, at cost (a count that found more counts against them). */
  writeOffsAtCostMinor: number;
  /** Write-offs whose cost is unknown (left out of writeOffsAtCostMinor, never counted as 0). */
  writeOffsCostUnknown: number;
  /** Purchases received at the price paid: the same sum as the spend beside sales. */
  purchasesReceivedMinor: number;
  boxDifferenceMinor: number;
  boxBankedMinor: number;
  byCategory: { category: PartCategory; accountCode: string; netMinor: number; taxMinor: number; grossMinor: number }[];
};

const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);

/** The figures the Books page shows for filing; each is the sum of one section of the export. */
export function filingTotals(f: Filing): FilingTotals {
  const cats = new Map<PartCategory, FilingTotals['byCategory'][number]>();
  for (const l of f.saleLines) {
    const c = cats.get(l.category) ?? { category: l.category, accountCode: l.accountCode, netMinor: 0, taxMinor: 0, grossMinor: 0 };
    c.netMinor += l.netMinor;
    c.taxMinor += l.taxMinor;
    c.grossMinor += l.grossMinor;
    cats.set(l.category, c);
  }
  return {
    cardSalesMinor: sum(f.saleLines.filter((l) => l.method === 'card').map((l) => l.grossMinor)),
    cashSalesMinor: sum(f.saleLines.filter((l) => l.method === 'cash').map((l) => l.grossMinor)),
    taxCollectedMinor: sum(f.saleLines.map((l) => l.taxMinor)),
    taxRefundedMinor: sum(f.refunds.map((r) => r.taxMinor)),
    cardRefundsMinor: sum(f.refunds.filter((r) => r.method === 'card').map((r) => r.amountMinor)),
    cashRefundsMinor: sum(f.refunds.filter((r) => r.method === 'cash').map((r) => r.amountMinor)),
    processorFeesMinor: sum(f.fees.map((x) => x.feeMinor)),
    writeOffLines: f.writeOffs.length,
    writeOffsAtCostMinor: sum(f.writeOffs.map((w) => w.costMinor ?? 0)),
    writeOffsCostUnknown: f.writeOffs.filter((w) => w.costMinor === null).length,
    purchasesReceivedMinor: sum(f.purchases.map((p) => p.costMinor)),
    boxDifferenceMinor: sum(f.boxCounts.map((c) => c.differenceMinor)),
    boxBankedMinor: sum(f.boxCounts.map((c) => c.banking?.amountMinor ?? 0)),
    byCategory: [...cats.values()].sort((a, b) => a.category.localeCompare(b.category)),
  };
}
