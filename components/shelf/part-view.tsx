import Link from 'next/link';
import { clsx } from 'clsx';
import type { PartPage } from '@/lib/inventory/part-page';
import { LAYOUTS } from '@/labels/layouts';
import { formatDateTime } from '@/lib/format';
import { formatQty, measureOf } from '@/lib/inventory/measure';
import { CATEGORY_WORDS } from '@/lib/inventory/words';
import { formatUnitPrice } from '@/lib/money';
import { PageTitle } from '@/components/ui/page-title';
import { StatePill } from '@/components/ui/state-pill';
import { AddUnitsForm } from '@/components/shelf/add-units-form';
import { AdjustForm } from '@/components/shelf/adjust-form';
import { AttachmentsPanel } from '@/components/shelf/attachments-panel';
import { CodeText } from '@/components/shelf/code-text';
import { PrintLabelsButton } from '@/components/shelf/print-labels-button';
import { SpecsTable } from '@/components/shelf/specs-table';
import { UnitActions } from '@/components/shelf/unit-actions';
import { MoveUnit } from '@/components/shelf/move-unit';
import { ScrollRegion } from '@/components/shelf/scroll-region';
import { TableHead } from '@/components/shelf/table-head';


const REASON_WORDS: Record<string, string> = {
  receive: 'received',
  move_in: 'moved in',
  move_out: 'moved out',
  adjust: 'corrected',
  count: 'counted',
  loan_out: 'lent',
  loan_return: 'returned',
  lost: 'lost',
  damaged: 'damaged',
  repair: 'repair',
  retire: 'retired',
  sale: 'sold',
  refund: 'refunded',
  kit_build: 'into a kit',
};

// A part as its page and its label's /s/<code> show it: summary, specs, units or stock per bin, files and
// history. Rendered on the server from lib/inventory/part-page.ts; `highlight` marks one unit's row.
export function PartView({ data, highlight }: { data: PartPage; highlight?: string }) {
  const { detail: d, staff, locations, layoutId, qr } = data;
  const { part } = d;
  const labelCount =
    part.tracking === 'unit' ? d.units.filter((u) => u.state !== 'retired').length : part.code ? 1 : 0;
  const locs = locations.map((l) => ({ id: l.id, name: l.name }));

  return (
    <div className="space-y-5">
      <PageTitle
        title={part.name}
        lead={[CATEGORY_WORDS[part.category], part.keySpec].filter(Boolean).join(' · ')}
      >
        {staff ? (
          <Link href={`/shelf/parts/${part.id}/edit`} className="btn-quiet">
            Edit
          </Link>
        ) : null}
      </PageTitle>

      <section aria-labelledby="summary" className="card grid gap-4 sm:grid-cols-[1fr_auto]">
        <div>
          <h2 id="summary" className="sr-only">
            Summary
          </h2>
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
            <dt className="muted">SKU</dt>
            <dd className="font-mono">{part.sku}</dd>
            {part.code ? (
              <>
                <dt className="muted">Label code</dt>
                <dd>
                  <CodeText code={part.code} />
                </dd>
              </>
            ) : null}
            <dt className="muted">On hand</dt>
            <dd>
              <strong className="text-lg tabular-nums">
                {formatQty(d.onHand, part.tracking === 'unit' ? 'each' : part.saleUnit)}
              </strong>
              {part.tracking === 'unit' ? ' units on the shelf' : ''}
              {d.below ? (
                <span className="ml-2 rounded border border-amber-700 px-1 text-xs font-semibold text-amber-950 dark:text-amber-200">
                  below reorder point ({part.reorderPoint})
                </span>
              ) : null}
            </dd>
            <dt className="muted">Reorder at</dt>
            <dd>{part.reorderPoint || 'not set'}</dd>
            <dt className="muted">Lending</dt>
            <dd>{part.lendable ? 'can be lent' : 'not lent'}</dd>
            <dt className="muted">Counter</dt>
            <dd>
              {part.sellable && part.priceMinor !== null
                ? formatUnitPrice(part.priceMinor, d.currency, part.saleUnit)
                : 'not sold'}
            </dd>
            {part.notes ? (
              <>
                <dt className="muted">Notes</dt>
                <dd>{part.notes}</dd>
              </>
            ) : null}
          </dl>
          {staff && labelCount > 0 ? (
            <div className="mt-4">
              <PrintLabelsButton
                selection={{ kind: 'part', partId: part.id, includePart: false }}
                expected={labelCount}
                layouts={LAYOUTS.map((l) => ({ id: l.id, name: l.name }))}
                defaultLayout={layoutId}
                label={
                  part.tracking === 'unit'
                    ? `Print ${labelCount} unit label${labelCount === 1 ? '' : 's'}`
                    : 'Print part label'
                }
              />
            </div>
          ) : null}
        </div>
        {qr ? (
          <figure className="text-center">
            <div
              className="mx-auto w-28 [&_svg]:h-auto [&_svg]:w-full"
              role="img"
              aria-label={`QR code for ${part.code}`}
              dangerouslySetInnerHTML={{ __html: qr }}
            />
            <figcaption className="muted text-xs">Scan to open this part</figcaption>
          </figure>
        ) : null}
      </section>

      <section aria-labelledby="specs" className="card">
        <h2 id="specs" className="mb-2 text-lg font-bold">
          Specs
        </h2>
        <SpecsTable category={part.category} specs={part.specs} />
      </section>

      {part.tracking === 'unit' ? (
        <section aria-labelledby="units" className="card">
          <h2 id="units" className="mb-2 text-lg font-bold">
            Units ({d.units.length})
          </h2>
          <ScrollRegion label="Units">
            <table className="table-dense min-w-[40rem]">
              <TableHead columns={['Code', 'Serial', 'State', 'Where', 'Notes', staff && 'Change']} />
              <tbody>
                {d.units.map((u) => (
                  <tr
                    key={u.id}
                    id={`unit-${u.code}`}
                    aria-current={highlight === u.code ? 'true' : undefined}
                    className={clsx(
                      highlight === u.code && 'bg-accent-soft outline-2 outline-accent dark:bg-teal-950',
                    )}
                  >
                    <td>
                      <CodeText code={u.code} />
                    </td>
                    <td className="whitespace-nowrap">{u.serial}</td>
                    <td>
                      <StatePill state={u.state} />
                    </td>
                    <td>
                      {u.kitBoxName ? (
                        <Link href={`/kits/boxes/${u.kitBoxId}`}>in {u.kitBoxName}</Link>
                      ) : u.locationId ? (
                        <Link href={`/shelf/locations/${u.locationId}`}>{u.locationName}</Link>
                      ) : (
                        '—'
                      )}
                    </td>
                    <td className="max-w-xs">{u.notes}</td>
                    {staff ? (
                      <td>
                        <div className="flex flex-wrap gap-1">
                          <UnitActions unitId={u.id} state={u.state} code={u.code} />
                          {!u.kitBoxId && (u.state === 'on_shelf' || u.state === 'in_repair') ? (
                            <MoveUnit
                              unitId={u.id}
                              code={u.code}
                              locations={locs}
                              currentLocationId={u.locationId}
                            />
                          ) : null}
                        </div>
                      </td>
                    ) : null}
                  </tr>
                ))}
              </tbody>
            </table>
          </ScrollRegion>
          {staff ? (
            <div className="mt-4">
              <AddUnitsForm partId={part.id} locations={locs} />
            </div>
          ) : null}
        </section>
      ) : (
        <section aria-labelledby="stock" className="card">
          <h2 id="stock" className="mb-2 text-lg font-bold">
            Stock per bin
          </h2>
          {d.stock.length === 0 ? (
            <p className="muted text-sm">None in any bin yet.</p>
          ) : (
            <table className="table-dense">
              <TableHead columns={['Bin', 'Quantity']} />
              <tbody>
                {d.stock.map((s) => (
                  <tr key={s.locationId}>
                    <td>
                      <Link href={`/shelf/locations/${s.locationId}`}>{s.locationName}</Link>
                    </td>
                    <td className="tabular-nums">{s.qty}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          {staff ? (
            <div className="mt-4 space-y-3">
              <div className="flex flex-wrap gap-2">
                <Link href={`/shelf/receive?part=${part.id}`} className="btn-quiet">
                  Receive
                </Link>
                <Link href={`/shelf/move?part=${part.id}`} className="btn-quiet">
                  Move between bins
                </Link>
              </div>
              {locs.length ? (
                <AdjustForm
                  partId={part.id}
                  measure={measureOf(part.saleUnit)}
                  locations={locs.map((l) => ({
                    ...l,
                    qty: d.stock.find((s) => s.locationId === l.id)?.qty ?? 0,
                  }))}
                />
              ) : null}
            </div>
          ) : null}
        </section>
      )}

      <section aria-labelledby="files" className="card">
        <h2 id="files" className="mb-2 text-lg font-bold">
          Datasheets and photos
        </h2>
        <AttachmentsPanel partId={part.id} attachments={d.attachments} canWrite={staff} />
      </section>

      <section aria-labelledby="history" className="card">
        <h2 id="history" className="mb-2 text-lg font-bold">
          History
        </h2>
        {d.movements.length === 0 ? (
          <p className="muted text-sm">Nothing has moved yet.</p>
        ) : (
          <ScrollRegion label="History">
            <table className="table-dense min-w-[36rem]">
              <TableHead columns={['When', 'What', 'Change', 'Where', 'Who', 'Note']} />
              <tbody>
                {d.movements.map((m) => (
                  <tr key={m.id}>
                    <td className="whitespace-nowrap">{formatDateTime(m.at, d.timeZone)}</td>
                    <td>
                      {REASON_WORDS[m.reason] ?? m.reason}
                      {m.unitCode ? (
                        <span className="text-xs">
                          {' '}
                          <CodeText code={m.unitCode} />
                        </span>
                      ) : null}
                    </td>
                    <td className="tabular-nums">{m.delta > 0 ? `+${m.delta}` : m.delta}</td>
                    <td>{m.locationName ?? '—'}</td>
                    <td>{m.actorName ?? '—'}</td>
                    <td className="max-w-xs">{m.note}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </ScrollRegion>
        )}
      </section>
    </div>
  );
}
