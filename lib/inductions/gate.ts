import 'server-only';
import { builtOnce } from '@/db/built-once';
import { scoped } from '@/db/scoped';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import type { PartCategory } from '@/db/types';
import { CATEGORY_WORDS } from '@/lib/inventory/words';
import { formatDate } from '@/lib/format';

// The induction gate of a borrow: which inductions the things taken need (their kit template, their
// parts' categories), and which of those the borrower has no current sign-off for. Read inside the
// borrow's transaction, so a sign-off withdrawn a moment earlier counts as withdrawn.

export type MissingInduction = {
  id: string;
  name: string;
  /** What needs it: "the kit “…”" or "LED parts". */
  neededBy: string[];
  /** When the borrower's last sign-off ran out, if it did. */
  expiredAt: Date | null;
};

/**
 * The inductions these part categories ask for. Built once per process (every borrow and preview reads
 * it): the categories go as one array parameter, so one statement serves any number of them.
 */
const categoryInductions = builtOnce('category_inductions', (db, spaceId: string, categories: PartCategory[]) =>
  scoped(db, { spaceId })
    .selectFrom('category_inductions as c')
    .innerJoin('inductions as i', (j) => j.onRef('i.id', '=', 'c.induction_id').onRef('i.space_id', '=', 'c.space_id'))
    .select(['i.id', 'i.name', 'c.category'])
    .where('c.space_id', '=', spaceId)
    .where('c.category', '=', sql<PartCategory>`any(${categories})`)
    .where('i.archived_at', 'is', null),
);

export async function missingInductions(
  db: Db,
  spaceId: string,
  borrowerId: string,
  need: { templateId: string | null; categories: PartCategory[] },
  at: Date,
): Promise<MissingInduction[]> {
  const categories = [...new Set(need.categories)];
  // The kit's inductions and the categories' are independent reads: side by side.
  const [byTemplate, byCategory] = await Promise.all([
    need.templateId
      ? scoped(db, { spaceId })
          .selectFrom('kit_template_inductions as k')
          .innerJoin('inductions as i', (j) =>
            j.onRef('i.id', '=', 'k.induction_id').onRef('i.space_id', '=', 'k.space_id'),
          )
          .innerJoin('kit_templates as t', (j) =>
            j.onRef('t.id', '=', 'k.template_id').onRef('t.space_id', '=', 'k.space_id'),
          )
          .select(['i.id', 'i.name', 't.name as why'])
          .where('k.space_id', '=', spaceId)
          .where('k.template_id', '=', need.templateId)
          .where('i.archived_at', 'is', null)
          .execute()
      : [],
    categories.length ? categoryInductions(db, spaceId, categories) : [],
  ]);
  if (!byTemplate.length && !byCategory.length) return [];

  const byId = new Map<string, MissingInduction>();
  const need1 = (id: string, name: string, why: string) => {
    const m = byId.get(id) ?? { id, name, neededBy: [], expiredAt: null };
    if (!m.neededBy.includes(why)) m.neededBy.push(why);
    byId.set(id, m);
  };
  for (const r of byTemplate) need1(r.id, r.name, `the kit “${r.why}”`);
  for (const r of byCategory) need1(r.id, r.name, `${CATEGORY_WORDS[r.category]} parts`);

  const signoffs = await scoped(db, { spaceId })
    .selectFrom('induction_signoffs')
    .select(['induction_id', 'expires_at'])
    .where('space_id', '=', spaceId)
    .where('user_id', '=', borrowerId)
    .where('induction_id', 'in', [...byId.keys()])
    .where('revoked_at', 'is', null)
    .execute();
  for (const s of signoffs) {
    const m = byId.get(s.induction_id);
    if (!m) continue;
    if (s.expires_at === null || new Date(s.expires_at) > at) byId.delete(s.induction_id);
    else if (!m.expiredAt || new Date(s.expires_at) > m.expiredAt) m.expiredAt = new Date(s.expires_at);
  }
  return [...byId.values()].sort((a, b) => a.name.localeCompare(b.name));
}

/** The people who can sign someone off here: the space's stewards with access switched on. */
export async function stewardsToAsk(db: Db, spaceId: string): Promise<string[]> {
  const rows = await scoped(db, { spaceId })
    .selectFrom('memberships as m')
    .innerJoin('users as u', 'u.id', 'm.user_id')
    .select('u.name')
    .where('m.space_id', '=', spaceId)
    .where('m.disabled_at', 'is', null)
    .where('u.disabled_at', 'is', null)
    .where(sql<boolean>`'steward' = any(m.roles)`)
    .orderBy('u.name')
    .limit(6)
    .execute();
  return rows.map((r) => r.name);
}

/** The answer to a borrow the gate stops: what is missing, why, and whom to ask. */
export function inductionRefusal(
  missing: MissingInduction[],
  stewards: string[],
  opts: { self: boolean; timeZone: string },
): { message: string; fields: Record<string, string[]> } {
  const items = missing.map((m) => {
    const state = m.expiredAt
      ? `sign-off ran out on ${formatDate(m.expiredAt, opts.timeZone)}`
      : 'no sign-off yet';
    return `“${m.name}” (needed for ${m.neededBy.join(' and ')}; ${state})`;
  });
  const whom = stewards.length
    ? `Ask a steward to sign ${opts.self ? 'you' : 'them'} off: ${stewards.join(', ')}.`
    : 'Ask a steward of this space to sign them off.';
  return {
    message: `${opts.self ? 'You need' : 'This member needs'} ${missing.length === 1 ? 'an induction' : 'inductions'} first: ${items.join('; ')}. ${whom}`,
    fields: {
      inductions: missing.map((m) => `${m.name}: ${m.expiredAt ? 'sign-off expired' : 'not signed off'}`),
      override: ['a steward may lend anyway with gate "inductions" and a written reason'],
    },
  };
}
