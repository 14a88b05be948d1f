import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { listLocations } from '@/lib/inventory/locations';
import { findPartSummary } from '@/lib/inventory/scope';
import { chooseLayout } from '@/lib/inventory/labels';
import { LAYOUTS } from '@/labels/layouts';
import { PageTitle } from '@/components/ui/page-title';
import { StockForm } from '@/components/shelf/stock-form';

const WORDS = {
  receive: {
    title: 'Receive stock',
    lead: 'Counted stock goes into a bin; a labelled part gets new units, each with its own code.',
  },
  move: {
    title: 'Move stock',
    lead: 'Move counted stock from one bin to another. The move is refused if the first bin holds fewer.',
  },
};

/** The receive and move pages: the same form in two modes, a part chosen already when linked with ?part=. */
export function stockPage(mode: 'receive' | 'move') {
  return async function StockPage({ searchParams }: { searchParams: Promise<{ part?: string }> }) {
    const ctx = await requirePageRole('steward', 'admin');
    const { part } = await searchParams;
    const [locations, initialPart, layoutId] = await Promise.all([
      listLocations(db, ctx),
      findPartSummary(db, ctx, part),
      chooseLayout(db, ctx),
    ]);
    return (
      <div>
        <PageTitle title={WORDS[mode].title} lead={WORDS[mode].lead} />
        <StockForm
          mode={mode}
          locations={locations.map((l) => ({ id: l.id, name: l.name }))}
          initialPart={initialPart}
          labels={{ layouts: LAYOUTS.map((l) => ({ id: l.id, name: l.name })), defaultLayout: layoutId }}
        />
      </div>
    );
  };
}

export const stockMetadata = (mode: 'receive' | 'move') => ({ title: WORDS[mode].title });
