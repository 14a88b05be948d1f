import Link from 'next/link';
import { db } from '@/db';
import { requirePageUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { formatDate } from '@/lib/format';
import { listRepairs } from '@/lib/inventory/units';
import { PageTitle } from '@/components/ui/page-title';
import { CodeText } from '@/components/shelf/code-text';
import { UnitActions } from '@/components/shelf/unit-actions';

export const metadata = { title: 'Repairs' };

export default async function RepairsPage() {
  const ctx = await requirePageUser();
  const staff = isStaff(ctx);
  const [units, space] = await Promise.all([
    listRepairs(db, ctx),
    db.selectFrom('spaces').select('time_zone').where('id', '=', ctx.spaceId).executeTakeFirstOrThrow(),
  ]);
  return (
    <div className="space-y-4">
      <PageTitle
        title="In repair"
        lead="Units taken off the shelf until someone fixes them. Put them back when they work, or retire them."
      />
      {units.length === 0 ? (
        <p className="card muted">Nothing waits for repair.</p>
      ) : (
        <ul className="space-y-3">
          {units.map((u) => (
            <li key={u.id} className="card space-y-2">
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <Link href={`/shelf/parts/${u.partId}?unit=${u.code}#unit-${u.code}`} className="font-bold">
                  {u.partName}
                </Link>
                <span className="text-sm">
                  <CodeText code={u.code} /> · {u.serial}
                  {u.locationName ? ` · ${u.locationName}` : ''}
                  {u.since ? ` · since ${formatDate(u.since, space.time_zone)}` : ''}
                </span>
              </div>
              <p>{u.notes || <span className="muted">No note.</span>}</p>
              {staff ? <UnitActions unitId={u.id} state="in_repair" code={u.code} /> : null}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
