import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { ChainRole, PartCategory } from '@/db/types';
import { checkLines, type BuildInfo, type CheckLine, type CheckOutcome } from './check';
import type { OwnParts } from './schemas';

// The gate covers the member's whole build, not one loan at a time. A supply and a driver borrowed
// today and LEDs borrowed tomorrow end up on the same bench, so a loose borrow is checked together with
// the parts of the borrower's other open loose loans and any parts they described as their own. Every
// supply → driver → LED chain those parts can make, and that this borrow adds to, is checked like a kit;
// the worst of them decides the gate. Kit boxes stay out: each box is checked on its own contents.

/** Categories that take part in a build: the chain itself, its lead wire and the LEDs' heat sinks. */
export const BUILD_CATEGORIES: PartCategory[] = ['supply', 'driver', 'led', 'wire', 'heat_sink'];

/** A line of the build: `fresh` when it comes with this borrow (so chains through it are checked now). */
export type BuildLine = CheckLine & { fresh: boolean; own: boolean };

/** More chains than this in one build are not worth enumerating; the worst of the first ones decides. */
const MAX_CHAINS = 60;

const ROLES: ChainRole[] = ['supply', 'driver', 'led', 'wire'];
const roleOf = (l: CheckLine): ChainRole | null =>
  l.chainRole ?? (ROLES.includes(l.category as ChainRole) ? (l.category as ChainRole) : null);

export const isBuildLine = (l: Pick<CheckLine, 'category' | 'chainRole'>) =>
  l.chainRole !== null || BUILD_CATEGORIES.includes(l.category);

/** The parts a borrower describes as their own, as lines of the build (tag keeps two loans' apart). */
export function ownPartLines(own: OwnParts | null | undefined, tag: string, fresh: boolean): BuildLine[] {
  if (!own) return [];
  const lines: BuildLine[] = [];
  const line = (role: ChainRole, name: string, specs: object, qty = 1): BuildLine => ({
    partId: `own:${tag}:${role}`,
    name,
    category: role as PartCategory,
    specs: specs as Record<string, unknown>,
    qty,
    chainRole: role,
    fresh,
    own: true,
  });
  // Named for whoever reads the loan later (a steward reads other people's loans), never "your".
  if (own.supply) lines.push(line('supply', `the borrower's own ${own.supply.volts} V supply`, own.supply));
  if (own.driver) lines.push(line('driver', `the borrower's own ${own.driver.type} driver`, own.driver));
  if (own.string) lines.push(line('led', "the borrower's own LEDs", own.string.led, own.string.count));
  if (own.heatSink)
    lines.push({
      ...line('wire', `the borrower's own heat sinks (${own.heatSink.cPerW} °C/W)`, { celsiusPerWatt: own.heatSink.cPerW }, own.heatSink.count),
      partId: `own:${tag}:heat_sink`,
      category: 'heat_sink',
      chainRole: null,
    });
  return lines;
}

/** The build parts the borrower has out on open loose loans, with the own parts described on them. */
export async function heldBuildLines(db: Db, spaceId: string, borrowerId: string): Promise<BuildLine[]> {
  const rows = await scoped(db, { spaceId })
    .selectFrom('loan_lines as ll')
    .innerJoin('loans', 'loans.id', 'll.loan_id')
    .innerJoin('parts', 'parts.id', 'll.part_id')
    .select([
      'll.part_id as partId',
      'parts.name',
      'parts.category',
      'parts.specs',
      'll.qty',
      'll.chain_role as chainRole',
    ])
    .where('loans.space_id', '=', spaceId)
    .where('loans.borrower_id', '=', borrowerId)
    .where('loans.status', '=', 'out')
    .where('loans.kit_box_id', 'is', null)
    .where('parts.category', 'in', BUILD_CATEGORIES)
    .orderBy('loans.out_at')
    .execute();
  const owns = await scoped(db, { spaceId })
    .selectFrom('loans')
    .select(['id', 'own_parts'])
    .where('space_id', '=', spaceId)
    .where('borrower_id', '=', borrowerId)
    .where('status', '=', 'out')
    .where('own_parts', 'is not', null)
    .orderBy('out_at')
    .execute();
  return [
    ...rows.map((r) => ({ ...r, fresh: false, own: false })),
    ...owns.flatMap((o) => ownPartLines(o.own_parts as OwnParts, o.id, false)),
  ];
}

/** Lines of the same part and role are one line (two loans of the same LED make one string). */
function merge(lines: BuildLine[]): BuildLine[] {
  const merged = new Map<string, BuildLine>();
  for (const l of lines) {
    const key = `${l.partId}:${roleOf(l) ?? l.category}`;
    const seen = merged.get(key);
    if (seen) {
      seen.qty += l.qty;
      seen.fresh ||= l.fresh;
    } else merged.set(key, { ...l });
  }
  return [...merged.values()];
}

const SEVERITY = { ok: 0, caution: 1, fail: 2 } as const;
const severity = (o: CheckOutcome) => (o.kind === 'unreadable' ? 3 : o.verdict ? SEVERITY[o.verdict] : -1);
const nameOf = (l: BuildLine) => (l.qty > 1 ? `${l.qty} × ${l.name}` : l.name);

/**
 * Checks the build: what the borrower holds plus what this borrow adds. Only chains through at least
 * one fresh line are checked (the others were gated when they went out). With a part of the chain
 * missing the answer is `incomplete` (not blocking) and says what the build has so far.
 */
export function checkBuild(held: BuildLine[], fresh: BuildLine[], ambientC?: number): CheckOutcome {
  const all = merge([...held, ...fresh]);
  const of = (r: ChainRole) => all.filter((l) => roleOf(l) === r);
  const supplies = of('supply');
  const drivers = of('driver');
  const leds = of('led');
  const extras = all.filter((l) => roleOf(l) === 'wire' || l.category === 'heat_sink');
  const info: Omit<BuildInfo, 'chains' | 'present'> = {
    held: held.filter((l) => !l.own).map(nameOf),
    own: all.filter((l) => l.own).map(nameOf),
  };

  const missing = [
    ...(supplies.length ? [] : ['a DC supply']),
    ...(drivers.length ? [] : ['an LED driver']),
    ...(leds.length ? [] : ['LEDs for the string']),
  ];
  if (missing.length) {
    const base = checkLines(all, { fromKitBox: false, ambientC });
    const present = [...supplies, ...drivers, ...leds, ...extras].map(nameOf);
    if (base.kind === 'none' && !present.length) return base;
    return {
      kind: 'incomplete',
      verdict: null,
      missing,
      cautions: base.cautions,
      build: { ...info, chains: [], present },
    };
  }

  const outcomes: CheckOutcome[] = [];
  outer: for (const s of supplies)
    for (const d of drivers)
      for (const l of leds) {
        const lines = [s, d, l, ...extras];
        if (!lines.some((x) => x.fresh)) continue;
        // Roles are fixed here so that the chain is exactly this supply, this driver and these LEDs.
        outcomes.push(
          checkLines(
            lines.map((x) => ({ ...x, chainRole: roleOf(x) })),
            { fromKitBox: true, ambientC },
          ),
        );
        if (outcomes.length >= MAX_CHAINS) break outer;
      }
  if (!outcomes.length) return checkLines([], { fromKitBox: false });
  const worst = outcomes.reduce((a, b) => (severity(b) > severity(a) ? b : a));
  // An unreadable chain has no report; the worst one carries its problems.
  const chains: BuildInfo['chains'] = outcomes.flatMap((o) =>
    o.kind === 'checked' ? [{ chain: o.chain, verdict: o.verdict }] : [],
  );
  return { ...worst, build: { ...info, chains, present: [] } };
}

/** Who reads the words: the borrower (`self`), or a steward lending for them. */
type Audience = { self: boolean };
const voice = ({ self }: Audience) =>
  self
    ? { Whose: 'Your', whose: 'your', who: 'you' }
    : { Whose: 'Their', whose: 'their', who: 'they' };

/** The build outcome in plain words for the borrow's answer: what was checked, or what is still missing. */
export function buildNote(outcome: CheckOutcome, audience: Audience = { self: true }): string | null {
  const b = outcome.build;
  if (!b) return null;
  const v = voice(audience);
  if (outcome.kind === 'incomplete')
    return (
      `${v.Whose} build is not complete yet: it still needs ${outcome.missing.join(', ')}. ` +
      `When ${v.who} borrow ${outcome.missing.length > 1 ? 'them' : 'it'}, or describe ${v.whose} own, the whole build is checked against ` +
      `${b.present.join(', ')}.`
    );
  if (outcome.kind === 'checked') {
    const c = outcome.chain;
    const with_ = b.held.length ? ` together with what ${v.who} already have out (${b.held.join(', ')})` : '';
    return `Checked as one build${with_}: ${c.supply} → ${c.driver} → ${c.ledCount} × ${c.led}: ${outcome.verdict}.`;
  }
  return null;
}

/**
 * The outcome a loose borrow is gated on: the whole build when this borrow adds a build part (or the
 * borrower describes their own), otherwise the check on the lines alone (a meter: nothing to check).
 */
export async function looseOutcome(
  db: Db,
  spaceId: string,
  borrowerId: string,
  lines: CheckLine[],
  ownParts: OwnParts | undefined,
  ambientC: number,
): Promise<CheckOutcome> {
  const fresh: BuildLine[] = [
    ...lines.filter(isBuildLine).map((l) => ({ ...l, fresh: true, own: false })),
    ...ownPartLines(ownParts, 'new', true),
  ];
  if (!fresh.length) return checkLines(lines, { fromKitBox: false, ambientC });
  return checkBuild(await heldBuildLines(db, spaceId, borrowerId), fresh, ambientC);
}

/** Why a borrow is refused, in words: the chain, its verdict and what to change. */
export function refusalReasons(outcome: CheckOutcome, audience: Audience = { self: true }): string[] {
  const chain =
    outcome.kind === 'checked'
      ? [
          `${outcome.build?.held.length ? `${voice(audience).Whose} whole build` : 'The chain'} ${outcome.chain.supply} → ${outcome.chain.driver} → ${outcome.chain.ledCount} × ${outcome.chain.led} gives ${outcome.verdict}`,
        ]
      : [];
  const why =
    outcome.kind === 'checked'
      ? outcome.report.checks.filter((c) => c.verdict === outcome.verdict).map((c) => c.message)
      : outcome.kind === 'unreadable'
        ? outcome.problems
        : outcome.kind === 'incomplete'
          ? outcome.missing.map((m) => `missing ${m}`)
          : [];
  return [...chain, ...why];
}
