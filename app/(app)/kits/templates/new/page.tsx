import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { partsForKits } from '@/lib/kits/templates';
import { spaceClock } from '@/lib/sales/periods';
import { TemplateForm } from '@/components/kits/template-form';
import { PageTitle } from '@/components/ui/page-title';

export const metadata = { title: 'New kit' };

export default async function NewTemplatePage() {
  const ctx = await requirePageRole('steward', 'admin');
  const parts = await partsForKits(db, ctx);
  return (
    <div className="mx-auto max-w-3xl">
      <PageTitle
        title="New kit"
        lead="A named parts list. Mark the supply, driver, LEDs and lead so every box of it is checked before it goes out."
      />
      <TemplateForm parts={parts} currency={(await spaceClock(db, ctx.spaceId)).currency} />
    </div>
  );
}
