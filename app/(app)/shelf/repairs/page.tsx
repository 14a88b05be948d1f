import Link from 'next/link';
import { db } from '@/db';
import { requirePageUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { formatDate } from '@/lib/format';
import { listRepairs } from '@/lib/inventory/units';
import { boxesOutOfService } from '@/lib/kits/upkeep';
import { OutOfServiceList } from '@/components/kits/out-of-service-list';
import { PageTitle } from '@/components/ui/page-title';
import { CodeText } from '@/components/shelf/code-text';
import { UnitActions } from '@/components/shelf/unit-actions';

export const metadata = { title: 'Repairs' };

export default async function RepairsPage() {
  const ctx = await requirePageUser();
  const staff = isStaff(ctx);
  const [units, boxes, space] = await Promise.all([
    listRepairs(db, ctx),
    boxesOutOfService(db, ctx),
    db.selectFrom('spaces').select('time_zone').where('id', '=', ctx.spaceId).executeTakeFirstOrThrow(),
  ]);
  return (
    <div className="space-y-4">
      <PageTitle
        title="In repair"
        lead="Kit boxes out of service and units taken off the shelf until someone fixes them. Refill a box from its page; put a unit back when it works, or retire it."
      />
      <section aria-labelledby="boxes-out" className="space-y-2">
        <h2 id="boxes-out" className="text-lg font-bold">
          Kit boxes out of service
        </h2>
        {boxes.length === 0 ? (
          <p className="card muted">Every kit box is in service.</p>
        ) : (
          <OutOfServiceList boxes={boxes} timeZone={space.time_zone} />
        )}
      </section>
      <h2 className="text-lg font-bold">Units in repair</h2>
      {units.length === 0 ? (
        <p className="card muted">No unit waits for repair.</p>
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
