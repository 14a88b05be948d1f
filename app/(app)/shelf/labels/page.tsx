import { db } from '@/db';
import { LAYOUTS, labelsPerPage } from '@/labels/layouts';
import { requirePageRole } from '@/lib/auth/guard';
import { env } from '@/lib/env';
import { chooseLayout, labelItemsFor } from '@/lib/inventory/labels';
import { listLocations } from '@/lib/inventory/locations';
import { PageTitle } from '@/components/ui/page-title';
import { LabelsPrinter } from '@/components/shelf/labels-printer';

export const metadata = { title: 'Labels' };

export default async function LabelsPage() {
  const ctx = await requirePageRole('steward', 'admin');
  const [locations, layoutId, today] = await Promise.all([
    listLocations(db, ctx),
    chooseLayout(db, ctx),
    // How many labels "Everything added today" makes, told before anything is generated.
    labelItemsFor(db, ctx, { kind: 'today' }, env().APP_BASE_URL),
  ]);
  return (
    <div className="max-w-4xl">
      <PageTitle
        title="Print labels"
        lead="Each label carries a QR that opens the item on any phone, its code in text, the part name and one key spec."
      />
      <LabelsPrinter
        layouts={LAYOUTS.map((l) => ({ id: l.id, name: l.name, perPage: labelsPerPage(l) }))}
        defaultLayout={layoutId}
        locations={locations.map((l) => ({ id: l.id, name: l.name }))}
        todayCount={today.length}
      />
    </div>
  );
}
