import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { ChainRole, PartCategory } from '@/db/types';
import { audit } from '@/lib/audit/log';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { ConflictError, ForbiddenError, InvalidError, NotFoundError } from '@/lib/errors';
import { keySpec } from '@/lib/inventory/specs';
import { checkLines, type CheckOutcome } from '@/lib/loans/check';
import { loanSettings } from '@/lib/loans/settings';
import type { TemplateInput } from './schemas';

// Kit templates: a named bill of parts with teaching notes and cautions; the lines with a chain role
// form the electrical chain the check runs on.

export type TemplateSummary = {
  id: string;
  name: string;
  description: string;
  lines: number;
  boxes: number;
  onShelf: number;
};

export async function listTemplates(db: Db, ctx: Ctx): Promise<TemplateSummary[]> {
  return scoped(db, ctx)
    .selectFrom('kit_templates as t')
    .select([
      't.id',
      't.name',
      't.description',
      sql<number>`(select count(*)::int from kit_template_lines l where l.space_id = t.space_id and l.template_id = t.id)`.as('lines'),
      sql<number>`(select count(*)::int from kit_boxes b where b.space_id = t.space_id and b.template_id = t.id and b.state <> 'retired')`.as(
        'boxes',
      ),
      sql<number>`(select count(*)::int from kit_boxes b where b.space_id = t.space_id and b.template_id = t.id and b.state = 'on_shelf')`.as(
        'onShelf',
      ),
    ])
    .where('t.space_id', '=', ctx.spaceId)
    .where('t.archived_at', 'is', null)
    .orderBy('t.name')
    .execute();
}

export type TemplateLine = {
  id: string;
  partId: string;
  name: string;
  sku: string;
  category: PartCategory;
  tracking: 'counted' | 'unit';
  keySpec: string;
  qty: number;
  chainRole: ChainRole | null;
};

export type TemplateDetail = {
  id: string;
  name: string;
  description: string;
  teachingNotes: string;
  cautions: string;
  /** The deposit a box of this kit needs before it is lent (minor units of the space's currency), or null. */
  depositMinor: number | null;
  lines: TemplateLine[];
  /** The check on the template's own parts (the catalogue specs, before any box is built). */
  check: CheckOutcome;
  boxes: { id: string; name: string; code: string; state: string }[];
};

export async function getTemplate(db: Db, ctx: Ctx, templateId: string): Promise<TemplateDetail> {
  const t = await scoped(db, ctx)
    .selectFrom('kit_templates')
    .select(['id', 'name', 'description', 'teaching_notes', 'cautions', 'deposit_minor'])
    .where('id', '=', templateId)
    .where('space_id', '=', ctx.spaceId)
    .executeTakeFirst();
  if (!t) throw new NotFoundError('No such kit.');
  const rows = await scoped(db, ctx)
    .selectFrom('kit_template_lines as l')
    .innerJoin('parts', 'parts.id', 'l.part_id')
    .select([
      'l.id',
      'l.part_id as partId',
      'parts.name',
      'parts.sku',
      'parts.category',
      'parts.tracking',
      'parts.specs',
      'l.qty',
      'l.chain_role as chainRole',
    ])
    .where('l.template_id', '=', t.id)
    .orderBy('l.position')
    .orderBy('parts.name')
    .execute();
  const boxes = await scoped(db, ctx)
    .selectFrom('kit_boxes')
    .select(['id', 'name', 'code', 'state'])
    .where('template_id', '=', t.id)
    .where('space_id', '=', ctx.spaceId)
    .orderBy('name')
    .execute();
  const lines = rows.map(({ specs, ...r }) => ({ ...r, keySpec: keySpec(r.category, specs) }));
  const check = checkLines(
    rows.map((r) => ({
      partId: r.partId,
      name: r.name,
      category: r.category,
      specs: r.specs,
      qty: r.qty,
      chainRole: r.chainRole,
    })),
    { fromKitBox: true, ambientC: (await loanSettings(db, ctx.spaceId)).ambientC },
  );
  return {
    id: t.id,
    name: t.name,
    description: t.description,
    teachingNotes: t.teaching_notes,
    cautions: t.cautions,
    depositMinor: t.deposit_minor,
    lines,
    check,
    boxes,
  };
}

async function assertParts(db: Db, spaceId: string, input: TemplateInput): Promise<void> {
  const ids = [...new Set(input.lines.map((l) => l.partId))];
  const found = await scoped(db, { spaceId })
    .selectFrom('parts')
    .select(['id', 'category'])
    .where('space_id', '=', spaceId)
    .where('id', 'in', ids)
    .execute();
  input.lines.forEach((l, i) => {
    const p = found.find((f) => f.id === l.partId);
    if (!p)
      throw new InvalidError('A part is not in this space.', { [`lines.${i}.partId`]: ['no such part'] });
    if (l.chainRole && l.chainRole !== p.category)
      throw new InvalidError(
        `Line ${i + 1}: a ${p.category.replace('_', ' ')} cannot be the chain's ${l.chainRole}.`,
        {
          [`lines.${i}.chainRole`]: [`the part is a ${p.category.replace('_', ' ')}`],
        },
      );
  });
}

function assertStaff(ctx: Ctx) {
  if (!isStaff(ctx)) throw new ForbiddenError();
}

const isUniqueViolation = (err: unknown) => (err as { code?: string })?.code === '23505';

async function writeLines(trx: Db, ctx: Ctx, templateId: string, input: TemplateInput) {
  await scoped(trx, ctx).deleteFrom('kit_template_lines').where('template_id', '=', templateId).execute();
  await scoped(trx, ctx)
    .insertInto('kit_template_lines')
    .values(
      input.lines.map((l, i) => ({
        space_id: ctx.spaceId,
        template_id: templateId,
        part_id: l.partId,
        qty: l.qty,
        chain_role: l.chainRole,
        position: i,
      })),
    )
    .execute();
}

export const createTemplate = (db: Db, ctx: Ctx, input: TemplateInput) => saveTemplate(db, ctx, input, null);

/** Editing a template changes what future builds and refills take; boxes already built keep their contents. */
export const updateTemplate = (db: Db, ctx: Ctx, templateId: string, input: TemplateInput) =>
  saveTemplate(db, ctx, input, templateId);

/** Creates (templateId null) or replaces a template with its whole list of lines, in one transaction. */
async function saveTemplate(
  db: Db,
  ctx: Ctx,
  input: TemplateInput,
  templateId: string | null,
): Promise<{ id: string }> {
  assertStaff(ctx);
  const row = {
    name: input.name,
    description: input.description,
    teaching_notes: input.teachingNotes,
    cautions: input.cautions,
    deposit_minor: input.depositMinor,
  };
  try {
    return await db.transaction().execute(async (trx) => {
      const t = templateId
        ? await scoped(trx, ctx)
            .updateTable('kit_templates')
            .set(row)
            .where('id', '=', templateId)
            .where('space_id', '=', ctx.spaceId)
            .returning('id')
            .executeTakeFirst()
        : await scoped(trx, ctx)
            .insertInto('kit_templates')
            .values({ ...row, space_id: ctx.spaceId })
            .returning('id')
            .executeTakeFirstOrThrow();
      if (!t) throw new NotFoundError('No such kit.');
      await assertParts(trx, ctx.spaceId, input);
      await writeLines(trx, ctx, t.id, input);
      await audit(trx, {
        spaceId: ctx.spaceId,
        actorId: ctx.userId,
        action: templateId ? 'kit_template.updated' : 'kit_template.created',
        targetType: 'kit_template',
        targetId: t.id,
        detail: { name: input.name, lines: input.lines.length },
      });
      return { id: t.id };
    });
  } catch (err) {
    if (isUniqueViolation(err))
      throw new ConflictError('A kit with that name exists already.', { name: ['already used'] });
    throw err;
  }
}

/** Lendable parts for the template form's part picker. */
export async function partsForKits(db: Db, ctx: Ctx) {
  assertStaff(ctx);
  const rows = await scoped(db, ctx)
    .selectFrom('parts')
    .select(['id', 'name', 'sku', 'category', 'tracking', 'specs'])
    .where('space_id', '=', ctx.spaceId)
    .where('archived_at', 'is', null)
    .where('category', '<>', 'kit_box')
    .orderBy('category')
    .orderBy('name')
    .execute();
  return rows.map(({ specs, ...p }) => ({ ...p, keySpec: keySpec(p.category, specs) }));
}
