import 'server-only';
import type { Db } from '@/db/connect';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { spaceMembers } from '@/lib/loans/queries';
import { previewLoan, type Preview } from '@/lib/loans/preview';
import { formatMoney } from '@/lib/money';
import { spaceClock } from '@/lib/sales/periods';
import { boxLines, type SelectedBox } from '@/lib/loans/selection';
import { boxDetail, boxHead, type BoxDetail } from './box-detail';
import { upkeepChoices, type UpkeepChoices } from './upkeep';

export type BoxPage = {
  box: BoxDetail;
  preview: Preview;
  staff: boolean;
  /** For a steward lending at the bench: whom to lend to. Empty for members. */
  members: { id: string; name: string; email: string }[];
  upkeep: UpkeepChoices | null;
  /** The kit's deposit, formatted in the space's currency, when its template asks for one. */
  deposit: string | null;
};

/**
 * Everything a kit box's page shows (the page its QR label opens): the box, the check on its exact parts,
 * and for stewards the people to lend to and the upkeep moves. The independent reads run side by side, so
 * the page waits for the slowest of them rather than for their sum (a phone on a slow network waits on
 * this before the first byte of the verdict).
 */
export async function boxPage(db: Db, ctx: Ctx, kitBoxId: string): Promise<BoxPage> {
  const staff = isStaff(ctx);
  // The box and its contents are read once, for the page and for the check alike.
  const [head, lines] = await Promise.all([boxHead(db, ctx, kitBoxId), boxLines(db, ctx.spaceId, kitBoxId)]);
  const selected: SelectedBox = {
    id: head.id,
    name: head.name,
    code: head.code,
    state: head.state,
    templateId: head.templateId,
    templateName: head.templateName,
    locationName: head.locationName,
  };
  const [box, preview, members, upkeep] = await Promise.all([
    boxDetail(db, ctx, head, lines),
    previewLoan(db, ctx, { kitBoxId }, { resolved: { box: selected, lines } }),
    staff ? spaceMembers(db, ctx) : Promise.resolve([]),
    // Upkeep of a box that is out or retired is not offered; the choices are cheap, so they are read
    // beside the box and dropped below when its state says so.
    staff ? upkeepChoices(db, ctx, kitBoxId) : Promise.resolve(null),
  ]);
  // Only a kit that asks for a deposit costs the extra read of the space's currency.
  const deposit = box.template.depositMinor
    ? formatMoney(box.template.depositMinor, (await spaceClock(db, ctx.spaceId)).currency)
    : null;
  return {
    deposit,
    box,
    preview,
    staff,
    members,
    upkeep: upkeep && box.state !== 'out' && box.state !== 'retired' ? upkeep : null,
  };
}
