import { checkKit, compareTopologies, kitSpecSchema, safetyCautions, type Caution, type KitReport, type TopologyRow } from '@/lib/electrical';
import { InvalidError, type FieldErrors } from '@/lib/errors';
import { firstNonFinite } from './finite';
import { parseBenchBody } from './parse';
import { compareBodySchema } from './schemas';
import { log } from '@/lib/log';

// The two public bench-check services behind POST /api/bench-check and /compare. Each takes the raw
// JSON body and returns the answer, or throws an InvalidError (400) naming the fields. Whatever the body,
// the answer is a 2xx with finite figures or a 4xx — never a 500.

export type BenchCheckAnswer = KitReport & { cautions: Caution[] };
/** A row without a feasible series resistor has no report: the key is left out rather than sent as null. */
export type CompareRow = Omit<TopologyRow, 'report'> & { report?: KitReport };
export type CompareAnswer = { rows: CompareRow[] };

export function benchCheck(raw: unknown): BenchCheckAnswer {
  const spec = parseBenchBody(raw, kitSpecSchema);
  return computed(raw, () => {
    const report = checkKit(spec);
    return { ...report, cautions: safetyCautions(spec, report) };
  });
}

export function benchCompare(raw: unknown): CompareAnswer {
  const body = parseBenchBody(raw, compareBodySchema);
  return computed(raw, () => ({
    rows: compareTopologies(body.string, body.supply, {
      amps: body.amps,
      pwmDuty: body.pwmDuty,
      wiring: body.wiring,
      heatSink: body.heatSink,
      ambientC: body.ambientC,
    }).map(({ report, ...row }) =>
      report ? { ...row, report } : row,
    ),
  }));
}

/**
 * Runs the maths on an accepted body. The schema's bounds should keep every figure finite; should some
 * corner still overflow or throw, the person gets a 400 naming the extreme inputs rather than a 500 or a
 * report with holes in it, and the server log keeps the body so the rule can be fixed.
 */
function computed<T>(raw: unknown, run: () => T): T {
  let answer: T;
  try {
    answer = run();
  } catch (err) {
    log.error({ body: raw, err }, 'bench-check: an accepted body failed to compute');
    throw notComputable(raw);
  }
  const bad = firstNonFinite(answer);
  if (bad) {
    log.error({ body: raw, nonFinite: bad }, 'bench-check: non-finite figures for an accepted body');
    throw notComputable(raw);
  }
  return answer;
}

/** Numbers far from bench scale are the likely cause: name them (or the body when none stands out). */
export function extremeInputs(raw: unknown, path = ''): string[] {
  if (typeof raw === 'number') {
    const a = Math.abs(raw);
    return a !== 0 && (a > 1e6 || a < 1e-6) ? [path || '(body)'] : [];
  }
  if (raw && typeof raw === 'object' && !Array.isArray(raw))
    return Object.entries(raw).flatMap(([k, v]) => extremeInputs(v, path ? `${path}.${k}` : k));
  return [];
}

function notComputable(raw: unknown): InvalidError {
  const names = extremeInputs(raw);
  const message = 'These values are outside what the check can compute; check their size and unit';
  const fields: FieldErrors = Object.fromEntries((names.length ? names : ['(body)']).map((n) => [n, [message]]));
  return new InvalidError(`${message}: ${Object.keys(fields).join(', ')}.`, fields);
}
