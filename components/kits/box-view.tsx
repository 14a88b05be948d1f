import Link from 'next/link';
import { formatDateTime } from '@/lib/format';
import type { BoxDetail } from '@/lib/kits/box-detail';
import type { BoxPage } from '@/lib/kits/box-page';
import { chainRoleWords } from '@/lib/domain';
import { BoxUpkeep } from '@/components/kits/box-upkeep';
import { CodeText } from '@/components/shelf/code-text';
import { Cautions } from '@/components/kits/cautions';
import { CheckReport } from '@/components/kits/check-report';
import { ActionButton } from '@/components/loans/action-button';
import { Alternatives } from '@/components/loans/alternatives';
import { BorrowPanel } from '@/components/loans/borrow-panel';
import { StatePill } from '@/components/ui/state-pill';

// A kit box as its QR label shows it, built for a phone at the bench: is it in, does it pass the check on
// its exact parts, borrow it (or hold it), what is inside, and how to build it safely. Rendered on the
// server from lib/kits/box-page.ts, both at /kits/boxes/<id> and at the label's own /s/<code>.
export function BoxView({ data, userId }: { data: BoxPage; userId: string }) {
  const { box, preview, staff, members, upkeep } = data;
  const tz = preview.timeZone;
  const takeable = box.state === 'on_shelf' || (box.state === 'held' && box.holds.mine?.status === 'ready');

  return (
    <div className="mx-auto max-w-xl space-y-4">
      <header>
        <p className="muted text-sm">
          {/* Underlined: in muted text the link's colour alone does not stand out enough. */}
          <Link href={`/kits/templates/${box.template.id}`} className="underline">
            {box.template.name}
          </Link>{' '}
          · label <CodeText code={box.code} />
        </p>
        <div className="flex flex-wrap items-center gap-2">
          <h1 className="text-2xl font-bold tracking-tight">{box.name}</h1>
          <StatePill state={box.state} />
        </div>
        {box.locationName ? <p className="muted text-sm">Kept on {box.locationName}</p> : null}
      </header>

      {box.loan ? (
        <section className="card" aria-label="Who has it">
          <p>
            Out{box.loan.borrowerName ? ` with ${box.loan.mine ? 'you' : box.loan.borrowerName}` : ''}, due
            back <strong>{formatDateTime(box.loan.dueAt, tz)}</strong>.
          </p>
          {box.loan.id ? (
            <p className="mt-1">
              <Link href={`/loans/${box.loan.id}`}>Open the loan</Link>
            </p>
          ) : null}
        </section>
      ) : null}

      <CheckReport result={preview.outcome} verdict={preview.outcome.verdict} />
      <Cautions cautions={preview.outcome.cautions} kitNotes={box.template.cautions} />
      {preview.alternatives.length || preview.gate === 'blocked' ? (
        <Alternatives items={preview.alternatives} />
      ) : null}

      {takeable ? (
        <BorrowPanel
          selection={{ kitBoxId: box.id }}
          gate={preview.gate}
          available={preview.available}
          unavailable={preview.unavailable}
          dueText={formatDateTime(preview.dueAt, tz)}
          staff={staff}
          members={members}
          userId={userId}
          inductions={preview.inductions}
          deposit={data.deposit}
        />
      ) : (
        <HoldSection box={box} />
      )}

      <section aria-labelledby="contents-heading" className="card">
        <h2 id="contents-heading" className="text-lg font-bold">
          In the box
        </h2>
        <ul className="mt-2 divide-y divide-stone-200 dark:divide-stone-800">
          {box.contents.map((c) => (
            <li key={`${c.partId}:${c.unitCode ?? ''}`} className="py-2">
              <span className="font-semibold">
                {c.qty > 1 ? `${c.qty} × ` : ''}
                {c.name}
              </span>
              <span className="muted block text-sm">
                {[c.chainRole ? chainRoleWords(c.chainRole) : null, c.keySpec || null].filter(Boolean).join(' · ')}
                {c.unitCode ? (
                  <>
                    {c.chainRole || c.keySpec ? ' · ' : ''}label <CodeText code={c.unitCode} />
                  </>
                ) : null}
              </span>
            </li>
          ))}
        </ul>
        {box.shortfall.length ? (
          <div className="mt-3 rounded-lg border border-amber-700 p-3">
            <p className="font-semibold">Short against the kit list:</p>
            <ul className="ml-5 list-disc">
              {box.shortfall.map((s) => (
                <li key={s.partId}>
                  {s.missing} × {s.name}
                </li>
              ))}
            </ul>
            {staff && box.state !== 'out' ? (
              <div className="mt-2">
                <ActionButton
                  url={`/api/kits/boxes/${box.id}/refill`}
                  label="Refill from the shelf"
                  busyLabel="Refilling…"
                  variant="primary"
                />
              </div>
            ) : null}
          </div>
        ) : null}
      </section>

      {upkeep ? (
        <BoxUpkeep
          boxId={box.id}
          contents={box.contents.map((c) => ({
            partId: c.partId,
            name: c.name,
            qty: c.qty,
            unitId: c.unitId,
            unitCode: c.unitCode,
          }))}
          choices={upkeep}
        />
      ) : null}

      {box.template.teachingNotes ? (
        <details className="card">
          <summary className="cursor-pointer text-lg font-bold">How to build it</summary>
          <p className="mt-2 whitespace-pre-line">{box.template.teachingNotes}</p>
        </details>
      ) : null}
    </div>
  );
}

const STATE_NOTE: Record<string, string> = {
  held: 'It is back and kept for the next person in the queue. ',
  in_repair: 'It came back short and waits to be refilled. ',
};

function HoldSection({ box }: { box: BoxDetail }) {
  if (box.loan?.mine) return null;
  if (box.state === 'retired') return null;
  const mine = box.holds.mine;
  return (
    <section aria-labelledby="hold-heading" className="card space-y-2">
      <h2 id="hold-heading" className="text-lg font-bold">
        Hold it for me
      </h2>
      {mine ? (
        <>
          <p>
            {mine.status === 'ready'
              ? 'It is back and kept for you: borrow it at the bench.'
              : 'You are in the queue; we will e-mail you when it is back.'}
          </p>
          <ActionButton
            url={`/api/holds/${mine.id}`}
            method="DELETE"
            label="Cancel my hold"
            busyLabel="Cancelling…"
          />
        </>
      ) : (
        <>
          <p className="muted">
            {STATE_NOTE[box.state] ?? ''}
            {box.holds.waiting
              ? `${box.holds.waiting} ${box.holds.waiting === 1 ? 'person is' : 'people are'} waiting. `
              : ''}
            We will e-mail you when it is yours to take.
          </p>
          <ActionButton
            url="/api/holds"
            body={{ kitBoxId: box.id }}
            label="Hold it"
            busyLabel="Holding…"
            variant="primary"
          />
        </>
      )}
    </section>
  );
}
