import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { UnitState } from '@/db/types';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { NotFoundError } from '@/lib/errors';
import { keySpec } from '@/lib/inventory/specs';
import { boxLines, boxesOfSpace, type SelectionLine } from '@/lib/loans/selection';
import { boxShortfall } from './boxes';

// Everything a kit box's page shows besides the check: contents, template notes and cautions, who has
// it and until when (the borrower's name only to stewards and to the borrower), and the hold queue.

export type BoxDetail = {
  id: string;
  name: string;
  code: string;
  state: UnitState;
  locationName: string | null;
  template: {
    id: string;
    name: string;
    description: string;
    teachingNotes: string;
    cautions: string;
    /** The deposit a borrow of this kit takes first (minor units of the space's currency), or null. */
    depositMinor: number | null;
  };
  contents: {
    partId: string;
    name: string;
    qty: number;
    unitId: string | null;
    unitCode: string | null;
    chainRole: string | null;
    keySpec: string;
  }[];
  shortfall: { partId: string; name: string; missing: number }[];
  loan: { id: string | null; dueAt: Date; borrowerName: string | null; mine: boolean } | null;
  holds: { waiting: number; mine: { id: string; status: 'waiting' | 'ready' } | null };
};

/** The box with its template's texts and its shelf; another space's box (or none) is not found. */
export async function boxHead(db: Db, ctx: Ctx, kitBoxId: string) {
  const box = await boxesOfSpace(db, ctx.spaceId)
    .select(['kit_templates.description', 'kit_templates.teaching_notes', 'kit_templates.cautions', 'kit_templates.deposit_minor'])
    .where('kit_boxes.id', '=', kitBoxId)
    .executeTakeFirst();
  if (!box) throw new NotFoundError('No such kit box.');
  return box;
}
export type BoxHead = Awaited<ReturnType<typeof boxHead>>;

export async function getBox(db: Db, ctx: Ctx, kitBoxId: string): Promise<BoxDetail> {
  // The contents are read beside the box (scoped to the space, so another space's box has none).
  const [box, lines] = await Promise.all([boxHead(db, ctx, kitBoxId), boxLines(db, ctx.spaceId, kitBoxId)]);
  return boxDetail(db, ctx, box, lines);
}

/**
 * The rest of a box's page from its head and contents, read by the caller (the label page reads them once
 * for this and for the check): who has it, the hold queue and what it lacks, side by side.
 */
export async function boxDetail(db: Db, ctx: Ctx, box: BoxHead, lines: SelectionLine[]): Promise<BoxDetail> {
  const [loan, holds, shortfall] = await Promise.all([
    scoped(db, ctx)
      .selectFrom('loans')
      .innerJoin('users', 'users.id', 'loans.borrower_id')
      .select(['loans.id', 'loans.due_at', 'loans.borrower_id', 'users.name'])
      .where('loans.kit_box_id', '=', box.id)
      .where('loans.status', '=', 'out')
      .executeTakeFirst(),
    scoped(db, ctx)
      .selectFrom('holds')
      .select(['id', 'user_id', 'status'])
      .where('kit_box_id', '=', box.id)
      .where('status', 'in', ['waiting', 'ready'])
      .orderBy('created_at')
      .execute(),
    boxShortfall(db, ctx.spaceId, box.id, box.templateId),
  ]);
  const mine = holds.find((h) => h.user_id === ctx.userId);
  const seeWho = (borrowerId: string) => isStaff(ctx) || borrowerId === ctx.userId;
  return {
    id: box.id,
    name: box.name,
    code: box.code,
    state: box.state,
    locationName: box.locationName,
    template: {
      id: box.templateId,
      name: box.templateName,
      description: box.description,
      teachingNotes: box.teaching_notes,
      cautions: box.cautions,
      depositMinor: box.deposit_minor,
    },
    contents: lines.map((l) => ({
      partId: l.partId,
      name: l.name,
      qty: l.qty,
      unitId: l.unitId ?? null,
      unitCode: l.unitCode,
      chainRole: l.chainRole,
      keySpec: keySpec(l.category, l.specs),
    })),
    shortfall,
    loan: loan
      ? {
          id: seeWho(loan.borrower_id) ? loan.id : null,
          dueAt: loan.due_at,
          borrowerName: seeWho(loan.borrower_id) ? loan.name : null,
          mine: loan.borrower_id === ctx.userId,
        }
      : null,
    holds: {
      waiting: holds.length,
      mine: mine ? { id: mine.id, status: mine.status as 'waiting' | 'ready' } : null,
    },
  };
}
