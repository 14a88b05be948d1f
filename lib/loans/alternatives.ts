import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { rankCandidates, type DriverSpec, type KitSpec, type SupplySpec } from '@/lib/electrical';

// "What works with this": when a loan's chain fails, the supplies and drivers of this space that pass
// with the same LEDs, best margin first. Candidates are parts with something free to take: a loose
// unit on the shelf or counted stock, plus the supply and driver already in the selection (so "keep
// your supply, take this driver" shows up).

export type Alternative = {
  verdict: 'ok' | 'caution';
  margin: number;
  supply: AlternativePart;
  driver: AlternativePart;
};
export type AlternativePart = {
  partId: string;
  name: string;
  free: number;
  inSelection: boolean;
  code: string | null;
};

type ShelfRow = {
  id: string;
  name: string;
  category: string;
  specs: Record<string, unknown>;
  free: number;
  code: string | null;
};

async function freeSuppliesAndDrivers(db: Db, spaceId: string): Promise<ShelfRow[]> {
  // A free unit: on the shelf, not inside a kit box. Counted parts: any stock in a bin.
  return scoped(db, { spaceId })
    .selectFrom('parts')
    .select(['parts.id', 'parts.name', 'parts.category', 'parts.specs'])
    .select((eb) => [
      sql<number>`(case when parts.tracking = 'unit'
        then (select count(*) from units u where u.space_id = parts.space_id and u.part_id = parts.id and u.state = 'on_shelf' and u.kit_box_id is null)
        else (select floor(coalesce(sum(s.qty), 0)) from stock s where s.space_id = parts.space_id and s.part_id = parts.id) end)::int`.as('free'),
      eb
        .selectFrom('units as u')
        .select('u.code')
        .whereRef('u.part_id', '=', 'parts.id')
        .where('u.state', '=', 'on_shelf')
        .where('u.kit_box_id', 'is', null)
        .orderBy('u.code')
        .limit(1)
        .as('code'),
    ])
    .where('parts.space_id', '=', spaceId)
    .where('parts.category', 'in', ['supply', 'driver'])
    .where('parts.archived_at', 'is', null)
    .where('parts.lendable', '=', true)
    .execute() as Promise<ShelfRow[]>;
}

export async function whatWorksWith(
  db: Db,
  spaceId: string,
  spec: KitSpec,
  selected: { supplyPartId?: string; driverPartId?: string },
  limit = 5,
): Promise<Alternative[]> {
  const rows = (await freeSuppliesAndDrivers(db, spaceId)).filter(
    (r) => r.free > 0 || r.id === selected.supplyPartId || r.id === selected.driverPartId,
  );
  const byId = new Map(rows.map((r) => [r.id, r]));
  const supplies = rows
    .filter((r) => r.category === 'supply')
    .map((r) => ({ id: r.id, supply: r.specs as unknown as SupplySpec }));
  const drivers = rows
    .filter((r) => r.category === 'driver')
    .map((r) => ({ id: r.id, driver: { type: 'buck', ...r.specs } as unknown as DriverSpec }));
  const result = rankCandidates({
    string: spec.string,
    supplies,
    drivers,
    limit,
    ...(spec.pwmDuty !== undefined ? { pwmDuty: spec.pwmDuty } : {}),
    ...(spec.wiring !== undefined ? { wiring: spec.wiring } : {}),
  });
  const part = (id: string, chosen?: string): AlternativePart => {
    const r = byId.get(id)!;
    return { partId: id, name: r.name, free: r.free, inSelection: id === chosen, code: r.code };
  };
  return result.candidates.map((c) => ({
    verdict: c.verdict,
    margin: c.margin,
    supply: part(c.supplyId, selected.supplyPartId),
    driver: part(c.driverId, selected.driverPartId),
  }));
}
