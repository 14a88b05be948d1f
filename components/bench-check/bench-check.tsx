'use client';
import { useMemo, useState, useSyncExternalStore } from 'react';
import { VerdictBadge } from '@/components/ui/verdict-badge';
import { type KitSpec, checkKit, compareTopologies, safetyCautions } from '@/lib/electrical';
import { DEFAULT_FORM, type FormState, restoreForm, specFromForm } from './form-state';
import { CautionsList, ChecksList, FiguresList, VerdictSummary } from './report-view';
import { ResultsBoundary } from './results-boundary';
import { ServerCheck } from './server-check';
import { SpecForm } from './spec-form';
import { ThermalPanel } from './thermal-panel';
import { TopologyTable } from './topology-table';
import { WindowPlot } from './window-plot';

/** sessionStorage key of the typed form: survives a reload or the page's own error screen. */
export const DRAFT_KEY = 'ohmstead.bench-check.form';

const subscribeToNothing = () => () => {};

function readDraft(): string | null {
  try {
    return sessionStorage.getItem(DRAFT_KEY);
  } catch {
    return null; // storage off: start from the example
  }
}

function parseDraft(text: string): FormState {
  try {
    return restoreForm(JSON.parse(text));
  } catch {
    return DEFAULT_FORM;
  }
}

/** The check on a valid spec; a throw in the maths becomes a message, never a broken page. */
function runCheck(spec: KitSpec) {
  try {
    const report = checkKit(spec);
    return { report, cautions: safetyCautions(spec, report), topologies: compareFor(spec) };
  } catch (err) {
    console.error('bench-check: the check failed on an accepted spec', JSON.stringify(spec), err);
    return null;
  }
}

/** The three-way comparison at the driver's set current (for a resistor: the LEDs' own default). */
function compareFor(spec: KitSpec) {
  try {
    const amps = spec.driver.type === 'resistor' ? undefined : spec.driver.outputAmps;
    return compareTopologies(spec.string, spec.supply, {
      amps,
      pwmDuty: spec.pwmDuty,
      wiring: spec.wiring,
      heatSink: spec.heatSink,
      ambientC: spec.ambientC,
    });
  } catch {
    return null; // the comparison is an extra: without it the check still stands
  }
}

/**
 * The bench check, live: the check is pure maths, so it runs in the browser on every keystroke with the
 * same schema and rules as the server.
 */
export function BenchCheck() {
  // What was typed before a reload or an error screen comes back from this tab's storage (the server
  // renders the example; the browser then shows the draft). Edits made here take over from it.
  const saved = useSyncExternalStore(subscribeToNothing, readDraft, () => null);
  const restored = useMemo(() => (saved ? parseDraft(saved) : DEFAULT_FORM), [saved]);
  const [edited, setEdited] = useState<FormState | null>(null);
  const form = edited ?? restored;
  const update = (next: FormState) => {
    setEdited(next);
    try {
      sessionStorage.setItem(DRAFT_KEY, JSON.stringify(next));
    } catch {
      /* storage full or off: the page still works */
    }
  };

  const { spec, errors, echoes } = useMemo(() => specFromForm(form), [form]);
  const result = useMemo(() => (spec ? runCheck(spec) : null), [spec]);
  const errorFields = Object.keys(errors);
  const formKey = JSON.stringify(form);

  return (
    <div className="grid grid-cols-1 gap-5 lg:grid-cols-[minmax(0,26rem)_minmax(0,1fr)] lg:items-start">
      <div className="min-w-0">
        <ResultsBoundary resetKey={formKey} what="form">
          <SpecForm form={form} errors={errors} echoes={echoes} onChange={update} />
        </ResultsBoundary>
        <button type="button" className="btn-quiet mt-3 w-full sm:w-auto" onClick={() => update(DEFAULT_FORM)}>
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
        <ResultsBoundary resetKey={formKey} what="results">
          {result && spec ? (
            <>
              <VerdictSummary report={result.report} />
              <WindowPlot spec={spec} report={result.report} />
              <ChecksList checks={result.report.checks} />
              <ThermalPanel spec={spec} report={result.report} />
              <CautionsList cautions={result.cautions} />
              <FiguresList report={result.report} />
              {result.topologies ? <TopologyTable rows={result.topologies} /> : null}
              <ServerCheck spec={spec} local={result.report} />
            </>
          ) : spec ? (
            <section className="card" role="alert">
              <h2 className="text-lg font-bold">The check could not run on these values</h2>
              <p className="mt-1 text-sm">Everything you typed is kept. Change a value to try again.</p>
            </section>
          ) : (
            <section className="card" aria-live="polite" data-waiting>
              <h2 className="text-lg font-bold">Waiting for a complete build</h2>
              <p className="muted mt-1 text-sm">
                {errorFields.length === 1 ? 'One field needs' : `${errorFields.length} fields need`} attention before the check can run;
                each is marked beside it in the form.
              </p>
            </section>
          )}
        </ResultsBoundary>
      </div>
    </div>
  );
}
