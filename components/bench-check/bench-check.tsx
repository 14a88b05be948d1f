'use client';
import { useMemo, useState } from 'react';
import { VerdictBadge } from '@/components/ui/verdict-badge';
import { checkKit, compareTopologies, safetyCautions } from '@/lib/electrical';
import { DEFAULT_FORM, type FormState, specFromForm } from './form-state';
import { CautionsList, ChecksList, FiguresList, VerdictSummary } from './report-view';
import { ServerCheck } from './server-check';
import { SpecForm } from './spec-form';
import { TopologyTable } from './topology-table';
import { WindowPlot } from './window-plot';

/**
 * The bench check, live: the check is pure maths, so it runs in the browser on every keystroke with the
 * same schema and rules as the server.
 */
export function BenchCheck() {
  const [form, setForm] = useState<FormState>(DEFAULT_FORM);
  const { spec, errors } = useMemo(() => specFromForm(form), [form]);
  const result = useMemo(() => {
    if (!spec) return null;
    const report = checkKit(spec);
    const amps = report.figures.ledAmpsPeak;
    return {
      report,
      cautions: safetyCautions(spec, report),
      topologies: amps > 0 ? compareTopologies(spec.string, spec.supply, { amps, pwmDuty: spec.pwmDuty }) : null,
    };
  }, [spec]);
  const errorCount = Object.keys(errors).length;

  return (
    <div className="grid grid-cols-1 gap-5 lg:grid-cols-[minmax(0,26rem)_minmax(0,1fr)] lg:items-start">
      <div className="min-w-0">
        <SpecForm form={form} errors={errors} onChange={setForm} />
        <button type="button" className="btn-quiet mt-3 w-full sm:w-auto" onClick={() => setForm(DEFAULT_FORM)}>
          Back to the example build
        </button>
        {/* On a phone the results sit below the form: keep the verdict in view while typing. */}
        <div className="sticky bottom-0 z-10 mt-3 flex items-center justify-between gap-3 rounded-t-xl border border-stone-200 bg-white/95 px-4 py-2 shadow-md lg:hidden dark:border-stone-800 dark:bg-stone-900/95">
          {result ? <VerdictBadge verdict={result.report.verdict} /> : <span className="text-sm font-semibold">Incomplete</span>}
          <a href="#bench-results" className="text-sm font-semibold">
            See the checks
          </a>
        </div>
      </div>

      <div id="bench-results" className="min-w-0 scroll-mt-4 space-y-5">
        {result && spec ? (
          <>
            <VerdictSummary report={result.report} />
            <WindowPlot spec={spec} report={result.report} />
            <ChecksList checks={result.report.checks} />
            <CautionsList cautions={result.cautions} />
            <FiguresList report={result.report} />
            {result.topologies ? <TopologyTable rows={result.topologies} /> : null}
            <ServerCheck spec={spec} local={result.report} />
          </>
        ) : (
          <section className="card" aria-live="polite">
            <h2 className="text-lg font-bold">Waiting for a complete build</h2>
            <p className="muted mt-1 text-sm">
              {errorCount === 1 ? 'One field needs' : `${errorCount} fields need`} attention before the check can run; each is marked in the
              form.
            </p>
          </section>
        )}
      </div>
    </div>
  );
}
