import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { listLocations } from '@/lib/inventory/locations';
import { PageTitle } from '@/components/ui/page-title';
import { PartForm } from '@/components/shelf/part-form';

export const metadata = { title: 'Add a part' };

export default async function NewPartPage() {
  const ctx = await requirePageRole('steward', 'admin');
  const [locations, space] = await Promise.all([
    listLocations(db, ctx),
    db.selectFrom('spaces').select('currency').where('id', '=', ctx.spaceId).executeTakeFirstOrThrow(),
  ]);
  return (
    <div className="max-w-4xl">
      <PageTitle
        title="Add a part"
        lead="Specs are checked against the category, so the compatibility check can use them straight away."
      />
      <PartForm
        locations={locations.map((l) => ({ id: l.id, name: l.name }))}
        currency={space.currency.trim()}
      />
    </div>
  );
}
