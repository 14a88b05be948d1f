import Link from 'next/link';
import { db } from '@/db';
import { requirePageUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { getTemplate } from '@/lib/kits/templates';
import { Cautions } from '@/components/kits/cautions';
import { CheckReport } from '@/components/kits/check-report';
import { PageTitle } from '@/components/ui/page-title';
import { StatePill } from '@/components/ui/state-pill';
import { orNotFound, pageId } from '../../../loans/or-not-found';
import { CHAIN_ROLE_WORDS } from '@/lib/domain';

export const metadata = { title: 'Kit' };

export default async function TemplatePage({ params }: { params: Promise<{ id: string }> }) {
  const ctx = await requirePageUser();
  const t = await orNotFound(async () => getTemplate(db, ctx, pageId((await params).id)));
  return (
    <div className="mx-auto max-w-3xl space-y-4">
      <PageTitle title={t.name} lead={t.description}>
        {isStaff(ctx) ? (
          <Link href={`/kits/templates/${t.id}/edit`} className="btn-quiet">
            Edit kit
          </Link>
        ) : null}
      </PageTitle>

      <section aria-labelledby="lines-heading" className="card overflow-x-auto">
        <h2 id="lines-heading" className="text-lg font-bold">
          Parts list
        </h2>
        <table className="table-dense mt-2">
          <thead>
            <tr>
              <th scope="col">Qty</th>
              <th scope="col">Part</th>
              <th scope="col">In the build</th>
            </tr>
          </thead>
          <tbody>
            {t.lines.map((l) => (
              <tr key={l.id}>
                <td>{l.qty}</td>
                <td>
                  {l.name}
                  <span className="muted block">{[l.sku, l.keySpec].filter(Boolean).join(' · ')}</span>
                </td>
                <td>{l.chainRole ? CHAIN_ROLE_WORDS[l.chainRole] : '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      <p className="muted text-sm">
        The check below uses the catalogue specs of these parts; each box is checked again on its own units
        before it is lent.
      </p>
      <CheckReport result={t.check} verdict={t.check.verdict} />
      <Cautions cautions={t.check.cautions} kitNotes={t.cautions} />

      {t.teachingNotes ? (
        <section aria-labelledby="notes-heading" className="card">
          <h2 id="notes-heading" className="text-lg font-bold">
            Teaching notes
          </h2>
          <p className="mt-2 whitespace-pre-line">{t.teachingNotes}</p>
        </section>
      ) : null}

      <section aria-labelledby="boxes-heading" className="card">
        <h2 id="boxes-heading" className="text-lg font-bold">
          Boxes of this kit
        </h2>
        {t.boxes.length === 0 ? <p className="muted mt-2">None built yet.</p> : null}
        <ul className="mt-2 space-y-1">
          {t.boxes.map((b) => (
            <li key={b.id} className="flex items-center gap-2">
              <Link href={`/kits/boxes/${b.id}`}>{b.name}</Link> <StatePill state={b.state} />
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
