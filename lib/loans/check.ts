import { z } from 'zod';
import type { ChainRole, PartCategory } from '@/db/types';
import { assembleChain, type ChainParts } from '@/lib/kits/chain';
import { checkKit, generalCautions, safetyCautions, type Caution, type KitReport, type KitSpec } from '@/lib/electrical';

// The compatibility check on the exact parts of a loan: assemble the chain from the lines, run checkKit,
// and say what the verdict means for lending. No database here, so the gate is easy to reason about.

export type CheckLine = {
  partId: string;
  name: string;
  category: PartCategory;
  specs: Record<string, unknown>;
  qty: number;
  chainRole: ChainRole | null;
};

/**
 * When a loose borrow is checked together with what the borrower already has out (lib/loans/build.ts):
 * every supply → driver → LED chain those parts can make, with its verdict; the parts that came from
 * earlier loans or were described as the borrower's own; and, while the build is not complete, what it
 * has so far (what the missing part will be checked against).
 */
export type BuildInfo = {
  chains: { chain: ChainParts; verdict: KitReport['verdict'] | 'unreadable' }[];
  held: string[];
  own: string[];
  present: string[];
};

type Outcome =
  /** A full chain, checked. */
  | {
      kind: 'checked';
      verdict: KitReport['verdict'];
      spec: KitSpec;
      report: KitReport;
      cautions: Caution[];
      changes: string[];
      chain: ChainParts;
    }
  /** Part of a chain is there but not all of it. Blocking for a kit box (it should be complete). */
  | { kind: 'incomplete'; verdict: 'fail' | null; missing: string[]; cautions: Caution[] }
  /** The chain is there but a part's stored specs cannot feed the check. Always blocking. */
  | { kind: 'unreadable'; verdict: 'fail'; problems: string[]; cautions: Caution[] }
  /** Nothing electrical to check (a meter, a soldering iron). */
  | { kind: 'none'; verdict: null; cautions: Caution[] };

export type CheckOutcome = Outcome & { build?: BuildInfo };

export type { ChainParts };

const CHAIN_CATEGORIES: PartCategory[] = ['supply', 'driver', 'led'];

// Shown whenever the check could not run: the general cautions still apply.
const GENERAL_CAUTIONS: Caution[] = generalCautions();

/** Lines of the same part and role count as one (two bins of the same LED make one string). */
function mergeLines(lines: CheckLine[]): CheckLine[] {
  const merged = new Map<string, CheckLine>();
  for (const l of lines) {
    const key = `${l.partId}:${l.chainRole ?? ''}`;
    const seen = merged.get(key);
    if (seen) seen.qty += l.qty;
    else merged.set(key, { ...l });
  }
  return [...merged.values()];
}

/**
 * Checks the parts. `fromKitBox`: a box's template names its chain, so a box with half a chain is
 * short and blocked; loose parts with half a chain (only a supply, say) are simply not checked.
 */
export function checkLines(
  lines: CheckLine[],
  { fromKitBox, ambientC }: { fromKitBox: boolean; ambientC?: number },
): CheckOutcome {
  const merged = mergeLines(lines);
  const roleOf = (l: CheckLine) => l.chainRole ?? (CHAIN_CATEGORIES.includes(l.category) ? l.category : null);
  const chainLines = merged.filter((l) => roleOf(l) !== null);
  if (!chainLines.some((l) => roleOf(l) !== 'wire'))
    return { kind: 'none', verdict: null, cautions: GENERAL_CAUTIONS };

  const chain = assembleChain(
    merged.map((l) => ({
      role: l.chainRole,
      category: l.category,
      name: l.name,
      qty: l.qty,
      specs: l.specs,
    })),
    { ambientC },
  );
  if (!chain.ok)
    return {
      kind: 'incomplete',
      verdict: fromKitBox ? 'fail' : null,
      missing: chain.missing,
      cautions: GENERAL_CAUTIONS,
    };

  let report: KitReport;
  try {
    report = checkKit(chain.spec);
  } catch (err) {
    if (!(err instanceof z.ZodError)) throw err;
    const problems = err.issues.map((i) => `${describePath(i.path, chain.parts)}: ${i.message}`);
    return { kind: 'unreadable', verdict: 'fail', problems, cautions: GENERAL_CAUTIONS };
  }
  const changes = report.checks.filter((c) => c.verdict !== 'ok').map((c) => c.message);
  return {
    kind: 'checked',
    verdict: report.verdict,
    spec: chain.spec,
    report,
    cautions: safetyCautions(chain.spec, report),
    changes,
    chain: chain.parts,
  };
}

function describePath(path: PropertyKey[], parts: ChainParts): string {
  const [head] = path;
  const part =
    head === 'supply'
      ? parts.supply
      : head === 'driver'
        ? parts.driver
        : head === 'string'
          ? parts.led
          : String(head);
  return `${part} (${path.map(String).join('.')})`;
}

/** What is stored on the loan: enough to show the check again exactly as it was at lending time. */
export function storedReport(outcome: CheckOutcome): Record<string, unknown> {
  switch (outcome.kind) {
    case 'checked':
      return {
        kind: 'checked',
        spec: outcome.spec,
        report: outcome.report,
        cautions: outcome.cautions,
        chain: outcome.chain,
        ...withBuild(outcome),
      };
    case 'incomplete':
      return { kind: 'incomplete', missing: outcome.missing, cautions: outcome.cautions, ...withBuild(outcome) };
    case 'unreadable':
      return { kind: 'unreadable', problems: outcome.problems, cautions: outcome.cautions, ...withBuild(outcome) };
    case 'none':
      return { kind: 'none', cautions: outcome.cautions };
  }
}

const withBuild = (o: CheckOutcome) => (o.build ? { build: o.build } : {});

export type StoredReport = {
  kind: CheckOutcome['kind'];
  spec?: KitSpec;
  report?: KitReport;
  cautions: Caution[];
  chain?: ChainParts;
  missing?: string[];
  problems?: string[];
  build?: BuildInfo;
};

/** Reads a stored report back, including the older `{ spec, report }` shape of the demo seed. */
export function readStoredReport(raw: unknown): StoredReport | null {
  if (!raw || typeof raw !== 'object') return null;
  const r = raw as Record<string, unknown>;
  const report = r.report as KitReport | undefined;
  const spec = r.spec as KitSpec | undefined;
  const kind = (r.kind as StoredReport['kind'] | undefined) ?? (report ? 'checked' : 'none');
  let cautions = Array.isArray(r.cautions) ? (r.cautions as Caution[]) : undefined;
  if (!cautions) cautions = spec && report ? safetyCautions(spec, report) : GENERAL_CAUTIONS;
  return {
    kind,
    spec,
    report,
    cautions,
    chain: r.chain as ChainParts | undefined,
    missing: Array.isArray(r.missing) ? (r.missing as string[]) : undefined,
    problems: Array.isArray(r.problems) ? (r.problems as string[]) : undefined,
    build: r.build && typeof r.build === 'object' ? (r.build as BuildInfo) : undefined,
  };
}
