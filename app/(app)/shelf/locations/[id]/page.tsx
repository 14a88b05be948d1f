import Link from 'next/link';
import { db } from '@/db';
import { LAYOUTS } from '@/labels/layouts';
import { requirePageUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { chooseLayout } from '@/lib/inventory/labels';
import { getLocation } from '@/lib/inventory/locations';
import { PageTitle } from '@/components/ui/page-title';
import { StatePill } from '@/components/ui/state-pill';
import { CodeText } from '@/components/shelf/code-text';
import { notFoundUnlessFound } from '@/components/shelf/not-found';
import { PrintLabelsButton } from '@/components/shelf/print-labels-button';

export const metadata = { title: 'Location' };

export default async function LocationPage({ params }: { params: Promise<{ id: string }> }) {
  const ctx = await requirePageUser();
  const { id } = await params;
  const { location, stock, units, boxes } = await notFoundUnlessFound(getLocation(db, ctx, id));
  const staff = isStaff(ctx);
  const layoutId = staff ? await chooseLayout(db, ctx) : '';
  const layouts = LAYOUTS.map((l) => ({ id: l.id, name: l.name }));
  return (
    <div className="space-y-4">
      <PageTitle title={location.name} lead={`A ${location.kind}.`}>
        {staff ? (
          <Link href="/shelf/counts" className="btn-quiet">
            Count this bin
          </Link>
        ) : null}
      </PageTitle>
      <section className="card space-y-3" aria-labelledby="loc-code">
        <h2 id="loc-code" className="font-bold">
          Label code <CodeText code={location.code} />
        </h2>
        {staff ? (
          <div className="flex flex-wrap gap-6">
            <PrintLabelsButton
              selection={{ kind: 'location', locationId: location.id, contents: false }}
              expected={1}
              layouts={layouts}
              defaultLayout={layoutId}
              label="Print the bin’s label"
            />
            <PrintLabelsButton
              selection={{ kind: 'location', locationId: location.id, contents: true }}
              expected={1 + stock.length + units.length + boxes.length}
              layouts={layouts}
              defaultLayout={layoutId}
              label="Print labels for everything in it"
            />
          </div>
        ) : null}
      </section>
      <section className="card" aria-labelledby="loc-stock">
        <h2 id="loc-stock" className="mb-2 font-bold">
          Counted stock
        </h2>
        {stock.length === 0 ? (
          <p className="muted text-sm">No counted stock here.</p>
        ) : (
          <table className="table-dense">
            <tbody>
              {stock.map((s) => (
                <tr key={s.partId}>
                  <td>
                    <Link href={`/shelf/parts/${s.partId}`}>{s.name}</Link>{' '}
                    <span className="muted font-mono text-xs">{s.sku}</span>
                  </td>
                  <td className="tabular-nums">{s.qty}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
      <section className="card" aria-labelledby="loc-units">
        <h2 id="loc-units" className="mb-2 font-bold">
          Labelled units
        </h2>
        {units.length === 0 ? (
          <p className="muted text-sm">No labelled units here.</p>
        ) : (
          <table className="table-dense">
            <tbody>
              {units.map((u) => (
                <tr key={u.id}>
                  <td>
                    <Link href={`/shelf/parts/${u.partId}?unit=${u.code}#unit-${u.code}`}>{u.name}</Link>
                  </td>
                  <td>
                    <CodeText code={u.code} />
                  </td>
                  <td>{u.serial}</td>
                  <td>
                    <StatePill state={u.state} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
      {boxes.length ? (
        <section className="card" aria-labelledby="loc-boxes">
          <h2 id="loc-boxes" className="mb-2 font-bold">
            Kit boxes
          </h2>
          <ul className="space-y-1">
            {boxes.map((b) => (
              <li key={b.id} className="flex items-center gap-2">
                <Link href={`/kits/boxes/${b.id}`}>{b.name}</Link> <StatePill state={b.state} />
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </div>
  );
}
