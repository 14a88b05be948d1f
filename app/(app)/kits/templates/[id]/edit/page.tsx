import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { getTemplate, partsForKits } from '@/lib/kits/templates';
import { spaceClock } from '@/lib/sales/periods';
import { TemplateForm } from '@/components/kits/template-form';
import { PageTitle } from '@/components/ui/page-title';
import { orNotFound, pageId } from '../../../../loans/or-not-found';

export const metadata = { title: 'Edit kit' };

export default async function EditTemplatePage({ params }: { params: Promise<{ id: string }> }) {
  const ctx = await requirePageRole('steward', 'admin');
  const t = await orNotFound(async () => getTemplate(db, ctx, pageId((await params).id)));
  const parts = await partsForKits(db, ctx);
  return (
    <div className="mx-auto max-w-3xl">
      <PageTitle
        title={`Edit ${t.name}`}
        lead="Boxes already built keep their contents; refills and new boxes follow the new list."
      />
      <TemplateForm
        parts={parts}
        templateId={t.id}
        currency={(await spaceClock(db, ctx.spaceId)).currency}
        initial={{
          name: t.name,
          description: t.description,
          teachingNotes: t.teachingNotes,
          cautions: t.cautions,
          depositMinor: t.depositMinor,
          lines: t.lines.map((l) => ({ partId: l.partId, qty: l.qty, chainRole: l.chainRole })),
        }}
      />
    </div>
  );
}
