import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { boxLocations } from '@/lib/kits/boxes';
import { listTemplates } from '@/lib/kits/templates';
import { BuildBoxForm } from '@/components/kits/build-box-form';
import { PageTitle } from '@/components/ui/page-title';

export const metadata = { title: 'Build a box' };

export default async function BuildBoxPage() {
  const ctx = await requirePageRole('steward', 'admin');
  const [templates, locations] = await Promise.all([listTemplates(db, ctx), boxLocations(db, ctx)]);
  return (
    <div className="mx-auto max-w-xl">
      <PageTitle
        title="Build a box"
        lead="Takes free labelled units and counted stock off the shelf for one box of the kit, and gives the box its label."
      />
      <BuildBoxForm templates={templates} locations={locations} />
    </div>
  );
}
