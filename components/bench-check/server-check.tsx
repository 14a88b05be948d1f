'use client';
import { useState } from 'react';
import type { KitReport, KitSpec } from '@/lib/electrical';
import { VerdictBadge } from '@/components/ui/verdict-badge';

type Answer =
  | { state: 'idle' }
  | { state: 'busy' }
  | { state: 'done'; report: KitReport; same: boolean }
  | { state: 'error'; message: string };

/**
 * Asks the server for the same check (POST /api/bench-check). The page already checks in the browser;
 * this confirms the answer and shows what another program would get from the API.
 */
export function ServerCheck({ spec, local }: { spec: KitSpec | null; local: KitReport | null }) {
  const [answer, setAnswer] = useState<Answer>({ state: 'idle' });

  async function ask() {
    if (!spec) return;
    setAnswer({ state: 'busy' });
    try {
      const res = await fetch('/api/bench-check', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify(spec),
      });
      const body = await res.json();
      if (!res.ok) {
        const fields = body?.error?.fields ? Object.keys(body.error.fields).join(', ') : '';
        setAnswer({ state: 'error', message: `${body?.error?.message ?? `The server answered ${res.status}.`}${fields ? ` (${fields})` : ''}` });
        return;
      }
      const report = body as KitReport;
      const same =
        local !== null &&
        report.verdict === local.verdict &&
        report.checks.length === local.checks.length &&
        report.checks.every((c, i) => c.id === local.checks[i].id && c.verdict === local.checks[i].verdict);
      setAnswer({ state: 'done', report, same });
    } catch {
      setAnswer({ state: 'error', message: 'Could not reach the server; the check above still stands.' });
    }
  }

  return (
    <div className="flex flex-wrap items-center gap-3">
      <button type="button" className="btn-quiet" onClick={ask} disabled={!spec || answer.state === 'busy'}>
        {answer.state === 'busy' ? 'Checking…' : 'Check on the server'}
      </button>
      <p role="status" className="text-sm">
        {answer.state === 'done' ? (
          <span className="inline-flex flex-wrap items-center gap-2">
            Server says <VerdictBadge verdict={answer.report.verdict} />
            {answer.same ? 'the same as this page.' : 'something different — the form may have changed since; ask again.'}
          </span>
        ) : answer.state === 'error' ? (
          <span className="font-semibold text-red-800 dark:text-red-300">{answer.message}</span>
        ) : null}
      </p>
    </div>
  );
}
