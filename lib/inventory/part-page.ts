import 'server-only';
import type { Db } from '@/db/connect';
import { qrSvg } from '@/labels/qr';
import { labelUrl } from '@/labels/url';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { env } from '@/lib/env';
import { chooseLayout } from './labels';
import { listLocations } from './locations';
import { getPartDetail } from './part-detail';

export type PartPage = {
  detail: Awaited<ReturnType<typeof getPartDetail>>;
  staff: boolean;
  /** The space's bins, for stewards' forms; empty for members. */
  locations: { id: string; name: string }[];
  layoutId: string;
  /** The part label's QR as SVG, or '' when the part has no label of its own. */
  qr: string;
};

/**
 * Everything a part's page shows (the page its label opens). The part, the bins and the label layout are
 * read side by side; only the QR waits for the part (it needs the code).
 */
export async function partPage(db: Db, ctx: Ctx, partId: string): Promise<PartPage> {
  const staff = isStaff(ctx);
  const [detail, locations, layoutId] = await Promise.all([
    getPartDetail(db, ctx, partId),
    staff ? listLocations(db, ctx) : Promise.resolve([]),
    chooseLayout(db, ctx),
  ]);
  const code = detail.part.code;
  const qr = code ? await qrSvg(labelUrl(env().APP_BASE_URL, code), { width: 120 }) : '';
  return { detail, staff, locations: locations.map((l) => ({ id: l.id, name: l.name })), layoutId, qr };
}
