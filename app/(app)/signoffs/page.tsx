import { db } from '@/db';
import { requirePageUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { formatDate } from '@/lib/format';
import { listInductions } from '@/lib/inductions/manage';
import { listSignoffs, type Signoff } from '@/lib/inductions/signoffs';
import { CATEGORY_WORDS } from '@/lib/inventory/words';
import { listTemplates } from '@/lib/kits/templates';
import { spaceMembers } from '@/lib/loans/queries';
import { loanSettings } from '@/lib/loans/settings';
import { PageTitle } from '@/components/ui/page-title';
import { InductionForm } from '@/components/inductions/induction-form';
import { SignoffForm } from '@/components/inductions/signoff-form';
import { WithdrawSignoff } from '@/components/inductions/withdraw-signoff';

export const metadata = { title: 'Sign-offs' };

/** Our words for where a sign-off stands. */
function standing(s: Signoff, tz: string): string {
  if (s.revokedAt) return `withdrawn ${formatDate(s.revokedAt, tz)}`;
  if (!s.current && s.expiresAt) return `ran out ${formatDate(s.expiresAt, tz)}`;
  return s.expiresAt ? `holds until ${formatDate(new Date(new Date(s.expiresAt).getTime() - 1), tz)}` : 'holds, no end date';
}

function SignoffList({ items, tz, withPerson, canWithdraw }: { items: Signoff[]; tz: string; withPerson: boolean; canWithdraw: boolean }) {
  if (!items.length) return <p className="muted">None yet.</p>;
  return (
    <ul className="divide-y divide-stone-200 dark:divide-stone-800">
      {items.map((s) => (
        <li key={s.id} className="flex flex-wrap items-start justify-between gap-2 py-2" data-signoff={s.id}>
          <div className="min-w-0">
            <p className="font-semibold break-words">
              {withPerson ? `${s.person}: ` : ''}
              {s.induction}
            </p>
            <p className="muted text-sm">
              Signed off by {s.signedBy ?? 'someone no longer here'} on {formatDate(s.signedAt, tz)}; {standing(s, tz)}
            </p>
            {s.note ? <p className="text-sm break-words">{s.note}</p> : null}
          </div>
          {canWithdraw && s.current ? <WithdrawSignoff id={s.id} what={`${s.person}: ${s.induction}`} /> : null}
        </li>
      ))}
    </ul>
  );
}

export default async function SignoffsPage() {
  const ctx = await requirePageUser();
  const staff = isStaff(ctx);
  const [settings, inductions, mine, all] = await Promise.all([
    loanSettings(db, ctx.spaceId),
    listInductions(db, ctx, { withArchived: staff }),
    listSignoffs(db, ctx, { userId: ctx.userId }),
    staff ? listSignoffs(db, ctx) : Promise.resolve([]),
  ]);
  const tz = settings.timeZone;
  const [members, templates] = staff ? await Promise.all([spaceMembers(db, ctx), listTemplates(db, ctx)]) : [[], []];
  const active = inductions.filter((i) => !i.archived);

  return (
    <div className="mx-auto max-w-3xl space-y-5">
      <PageTitle
        title="Sign-offs"
        lead={`What ${ctx.spaceName} shows members before they take certain kit, and who has been shown.`}
      />
      <section aria-labelledby="mine-heading" className="card">
        <h2 id="mine-heading" className="mb-2 text-lg font-bold">
          Your sign-offs
        </h2>
        <SignoffList items={mine} tz={tz} withPerson={false} canWithdraw={false} />
      </section>

      <section aria-labelledby="inductions-heading" className="card">
        <h2 id="inductions-heading" className="mb-2 text-lg font-bold">
          Inductions here
        </h2>
        {inductions.length ? (
          <ul className="divide-y divide-stone-200 dark:divide-stone-800">
            {inductions.map((i) => (
              <li key={i.id} className="py-2">
                <p className="font-semibold break-words">
                  {i.name}
                  {i.archived ? <span className="muted font-normal"> (archived)</span> : null}
                </p>
                {i.description ? <p className="text-sm break-words">{i.description}</p> : null}
                <p className="muted text-sm">
                  Needed for:{' '}
                  {[...i.templates.map((t) => `the kit “${t.name}”`), ...i.categories.map((c) => `${CATEGORY_WORDS[c]} parts`)].join(', ') ||
                    'nothing yet'}
                </p>
                {staff ? (
                  <InductionForm
                    existing={{ id: i.id, name: i.name, description: i.description, templateIds: i.templates.map((t) => t.id), categories: i.categories, archived: i.archived }}
                    templates={templates.map((t) => ({ id: t.id, name: t.name }))}
                  />
                ) : null}
              </li>
            ))}
          </ul>
        ) : (
          <p className="muted">This space has not defined any inductions.</p>
        )}
        {staff ? (
          <div className="mt-4 border-t border-stone-200 pt-4 dark:border-stone-800">
            <h3 className="mb-2 font-bold">Define an induction</h3>
            <InductionForm templates={templates.map((t) => ({ id: t.id, name: t.name }))} />
          </div>
        ) : (
          <p className="muted mt-2 text-sm">A steward signs you off at the bench.</p>
        )}
      </section>

      {staff ? (
        <>
          <section aria-labelledby="sign-heading" className="card">
            <h2 id="sign-heading" className="mb-2 text-lg font-bold">
              Sign someone off
            </h2>
            {active.length ? (
              <SignoffForm
                inductions={active.map((i) => ({ id: i.id, name: i.name }))}
                members={members.map((m) => ({ id: m.id, name: m.name }))}
              />
            ) : (
              <p className="muted">Define an induction first.</p>
            )}
          </section>
          <section aria-labelledby="all-heading" className="card">
            <h2 id="all-heading" className="mb-2 text-lg font-bold">
              Everyone’s sign-offs
            </h2>
            <SignoffList items={all} tz={tz} withPerson canWithdraw />
          </section>
        </>
      ) : null}
    </div>
  );
}
