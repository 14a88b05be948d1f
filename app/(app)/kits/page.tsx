import Link from 'next/link';
import { db } from '@/db';
import { requirePageUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { formatDate } from '@/lib/format';
import { listBoxes } from '@/lib/kits/boxes';
import { listTemplates } from '@/lib/kits/templates';
import { loanSettings } from '@/lib/loans/settings';
import { PageTitle } from '@/components/ui/page-title';
import { StatePill } from '@/components/ui/state-pill';
import { displayCode } from '@/labels/code';

export const metadata = { title: 'Kits' };

export default async function KitsPage() {
  const ctx = await requirePageUser();
  const [templates, boxes, settings] = await Promise.all([
    listTemplates(db, ctx),
    listBoxes(db, ctx),
    loanSettings(db, ctx.spaceId),
  ]);
  const staff = isStaff(ctx);
  return (
    <div className="space-y-6">
      <PageTitle
        title="Kits"
        lead="Ready-made boxes to borrow. Each box is checked on its exact parts before it goes out."
      >
        {staff ? (
          <>
            <Link href="/kits/templates/new" className="btn-quiet">
              New kit
            </Link>
            <Link href="/kits/boxes/new" className="btn-primary">
              Build a box
            </Link>
          </>
        ) : null}
      </PageTitle>

      <section aria-labelledby="kinds">
        <h2 id="kinds" className="mb-2 text-lg font-bold">
          Kinds of kit
        </h2>
        {templates.length === 0 ? (
          <p className="muted">No kits yet.</p>
        ) : (
          <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
            {templates.map((t) => (
              <li key={t.id} className="card">
                <Link href={`/kits/templates/${t.id}`} className="text-lg font-bold">
                  {t.name}
                </Link>
                <p className="muted mt-1 text-sm">{t.description}</p>
                <p className="mt-2 text-sm">
                  {t.onShelf} of {t.boxes} {t.boxes === 1 ? 'box' : 'boxes'} on the shelf · {t.lines} lines
                </p>
              </li>
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="boxes">
        <h2 id="boxes" className="mb-2 text-lg font-bold">
          Boxes
        </h2>
        <ul className="divide-y divide-stone-200 rounded-xl border border-stone-200 bg-white dark:divide-stone-800 dark:border-stone-800 dark:bg-stone-900">
          {boxes.map((b) => (
            <li key={b.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-3">
              <span>
                <Link href={`/kits/boxes/${b.id}`} className="font-semibold">
                  {b.name}
                </Link>
                <span className="muted block text-sm">
                  {b.templateName} · label {displayCode(b.code)}
                </span>
              </span>
              <span className="flex items-center gap-2 text-sm">
                {b.dueAt ? <span>back {formatDate(b.dueAt, settings.timeZone)}</span> : null}
                <StatePill state={b.state} />
              </span>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
