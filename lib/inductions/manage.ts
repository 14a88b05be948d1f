import 'server-only';
import { scoped } from '@/db/scoped';
import type { Db } from '@/db/connect';
import type { PartCategory } from '@/db/types';
import { audit } from '@/lib/audit/log';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, InvalidError, NotFoundError } from '@/lib/errors';
import type { InductionInput, InductionPatch } from './schemas';

// A space's inductions, in its own words, and what needs each one: kit templates and part categories.

export type Induction = {
  id: string;
  name: string;
  description: string;
  archived: boolean;
  templates: { id: string; name: string }[];
  categories: PartCategory[];
};

export async function listInductions(db: Db, ctx: Pick<Ctx, 'spaceId'>, opts: { withArchived?: boolean } = {}): Promise<Induction[]> {
  let q = scoped(db, ctx)
    .selectFrom('inductions')
    .select(['id', 'name', 'description', 'archived_at'])
    .where('space_id', '=', ctx.spaceId)
    .orderBy('name');
  if (!opts.withArchived) q = q.where('archived_at', 'is', null);
  const rows = await q.execute();
  if (!rows.length) return [];
  const ids = rows.map((r) => r.id);
  const [templates, categories] = await Promise.all([
    scoped(db, ctx)
      .selectFrom('kit_template_inductions as k')
      .innerJoin('kit_templates as t', (j) => j.onRef('t.id', '=', 'k.template_id').onRef('t.space_id', '=', 'k.space_id'))
      .select(['k.induction_id', 't.id', 't.name'])
      .where('k.space_id', '=', ctx.spaceId)
      .where('k.induction_id', 'in', ids)
      .orderBy('t.name')
      .execute(),
    scoped(db, ctx)
      .selectFrom('category_inductions')
      .select(['induction_id', 'category'])
      .where('space_id', '=', ctx.spaceId)
      .where('induction_id', 'in', ids)
      .orderBy('category')
      .execute(),
  ]);
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    description: r.description,
    archived: r.archived_at !== null,
    templates: templates.filter((t) => t.induction_id === r.id).map((t) => ({ id: t.id, name: t.name })),
    categories: categories.filter((c) => c.induction_id === r.id).map((c) => c.category),
  }));
}

async function refuseDuplicateName(trx: Db, spaceId: string, name: string, exceptId?: string) {
  let q = scoped(trx, { spaceId })
    .selectFrom('inductions')
    .select('id')
    .where('space_id', '=', spaceId)
    .where((eb) => eb(eb.fn('lower', ['name']), '=', name.toLowerCase()));
  if (exceptId) q = q.where('id', '!=', exceptId);
  if (await q.executeTakeFirst())
    throw new ConflictError(`There is already an induction called “${name}”.`, { name: ['already used here'] });
}

/** Replaces what needs this induction; every template must be this space's. */
async function setRequirements(trx: Db, spaceId: string, inductionId: string, templateIds?: string[], categories?: PartCategory[]) {
  if (templateIds) {
    if (templateIds.length) {
      const found = await scoped(trx, { spaceId })
        .selectFrom('kit_templates')
        .select('id')
        .where('space_id', '=', spaceId)
        .where('id', 'in', templateIds)
        .execute();
      const known = new Set(found.map((f) => f.id));
      const unknown = templateIds.findIndex((t) => !known.has(t));
      if (unknown >= 0)
        throw new InvalidError('A kit template named here does not exist.', { [`templateIds.${unknown}`]: ['no such kit template'] });
    }
    await scoped(trx, { spaceId }).deleteFrom('kit_template_inductions').where('induction_id', '=', inductionId).where('space_id', '=', spaceId).execute();
    if (templateIds.length)
      await scoped(trx, { spaceId })
        .insertInto('kit_template_inductions')
        .values(templateIds.map((t) => ({ space_id: spaceId, template_id: t, induction_id: inductionId })))
        .execute();
  }
  if (categories) {
    await scoped(trx, { spaceId }).deleteFrom('category_inductions').where('induction_id', '=', inductionId).where('space_id', '=', spaceId).execute();
    if (categories.length)
      await scoped(trx, { spaceId })
        .insertInto('category_inductions')
        .values(categories.map((c) => ({ space_id: spaceId, category: c, induction_id: inductionId })))
        .execute();
  }
}

export async function createInduction(db: Db, ctx: Ctx, input: InductionInput): Promise<Induction> {
  const id = await db.transaction().execute(async (trx) => {
    await refuseDuplicateName(trx, ctx.spaceId, input.name);
    const row = await scoped(trx, ctx)
      .insertInto('inductions')
      .values({ space_id: ctx.spaceId, name: input.name, description: input.description, created_at: now() })
      .returning('id')
      .executeTakeFirstOrThrow();
    await setRequirements(trx, ctx.spaceId, row.id, input.templateIds, input.categories);
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'induction.created',
      targetType: 'induction',
      targetId: row.id,
      detail: { ...input },
    });
    return row.id;
  });
  return oneInduction(db, ctx, id);
}

export async function updateInduction(db: Db, ctx: Ctx, inductionId: string, patch: InductionPatch): Promise<Induction> {
  await db.transaction().execute(async (trx) => {
    const before = await scoped(trx, ctx)
      .selectFrom('inductions')
      .select(['id', 'name', 'description', 'archived_at'])
      .where('id', '=', inductionId)
      .where('space_id', '=', ctx.spaceId)
      .forUpdate()
      .executeTakeFirst();
    if (!before) throw new NotFoundError('No such induction.');
    if (patch.name !== undefined && patch.name !== before.name) await refuseDuplicateName(trx, ctx.spaceId, patch.name, inductionId);
    const set: { name?: string; description?: string; archived_at?: Date | null } = {};
    if (patch.name !== undefined) set.name = patch.name;
    if (patch.description !== undefined) set.description = patch.description;
    if (patch.archived !== undefined) set.archived_at = patch.archived ? (before.archived_at ?? now()) : null;
    if (Object.keys(set).length) await scoped(trx, ctx).updateTable('inductions').set(set).where('id', '=', inductionId).execute();
    await setRequirements(trx, ctx.spaceId, inductionId, patch.templateIds, patch.categories);
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'induction.updated',
      targetType: 'induction',
      targetId: inductionId,
      detail: { before: { name: before.name, description: before.description, archived: before.archived_at !== null }, patch },
    });
  });
  return oneInduction(db, ctx, inductionId);
}

export async function oneInduction(db: Db, ctx: Pick<Ctx, 'spaceId'>, inductionId: string): Promise<Induction> {
  const all = await listInductions(db, ctx, { withArchived: true });
  const found = all.find((i) => i.id === inductionId);
  if (!found) throw new NotFoundError('No such induction.');
  return found;
}
