import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash, randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { sql } from 'kysely';
import { SPACE_TABLES } from '@/db/space-tables';
import type { Role } from '@/db/types';
import { newCode } from '@/labels/code';
import { HttpSession } from '../helpers/http';
import { closeTestDb, makeCode, makeLocation, makePart, makeSpace, makeStock, makeUnit, makeUser, testDb } from '../helpers/db';
import { apiRoutes, concrete } from '../helpers/routes';

// Another space's records through every route that names one, as every role: the answer is 404 and
// carries nothing of the record. The routes come from the route files themselves (each declaration's
// `notFound` says what kind of record its id names), so a new [id] route is probed without touching this
// file; a route naming a kind this file does not know fails until the kind is added below.
//
// 403 only where the declaration's `who` refuses the role for every id: the route answers that before
// it reads the id, so the answer is the same byte for byte as for an id that exists nowhere; the probe
// compares the two answers for every call. Whatever the role, the other space's rows are unchanged
// afterwards (md5 of all its rows in every space-owned table).

const ROLES: Role[] = ['member', 'steward', 'treasurer', 'admin'];

/** Record kind (a declaration's `notFound`) → which of the other space's records to name. */
type Kind = 'attachment' | 'hold' | 'invitation' | 'kit box' | 'kit' | 'loan' | 'location' | 'part' | 'person' | 'sale' | 'label' | 'count' | 'unit' | 'induction' | 'sign-off' | 'supplier' | 'offer' | 'order';
const KINDS: readonly Kind[] = ['attachment', 'hold', 'invitation', 'kit box', 'kit', 'loan', 'location', 'part', 'person', 'sale', 'label', 'count', 'unit', 'induction', 'sign-off', 'supplier', 'offer', 'order'];

/** Bodies that pass each route's schema, so the call reaches the service (which must answer 404). */
const BODIES: Record<string, unknown> = {
  'POST /api/kits/boxes/[id]/refill': {},
  'PUT /api/kits/templates/[id]': { name: 'Taken over', lines: [{ partId: randomUUID(), qty: 1 }] },
  'POST /api/loans/[id]/return': {},
  'PATCH /api/locations/[id]': { name: 'Taken over' },
  'PATCH /api/parts/[id]': { name: 'Taken over' },
  'POST /api/parts/[id]/units': { count: 1 },
  'PATCH /api/people/[id]': { disabled: true },
  'POST /api/sales/[id]/refunds': {},
  'PATCH /api/stock/counts/[id]': { lines: [] },
  'PATCH /api/stock/units/[id]': { state: 'retired', reason: 'taken over' },
  'POST /api/kits/boxes/[id]/contents': { partId: randomUUID(), qty: 1 },
  'POST /api/kits/boxes/[id]/take-apart': {},
  'POST /api/people/[id]/erase': { confirmEmail: 'nobody@tests.example' },
  'POST /api/people/[id]/settle-charges': { amountMinor: 100 },
  'POST /api/people/[id]/pay-charges': {},
  'PATCH /api/inductions/[id]': { name: 'Taken over' },
  'POST /api/inductions/[id]/signoffs': { userId: randomUUID() },
  'PATCH /api/suppliers/[id]': { name: 'Taken over' },
  'PATCH /api/orders/[id]': { note: 'taken over' },
  'POST /api/orders/[id]/send': {},
  'POST /api/orders/[id]/receive': { idempotencyKey: 'probe-key-0001', finish: true },
  'POST /api/orders/[id]/cancel': { note: 'taken over' },
  'POST /api/orders/[id]/approve': { note: 'taken over' },
};

type Call = { method: string; pattern: string; param: 'id' | 'code'; kind: string; body: boolean };

/** Each [id] / [code] route of the app build, per method, with its declaration's notFound and body. */
function probedCalls(): Call[] {
  return apiRoutes()
    .filter((r) => r.door === 'app' && /\[(id|code)\]/.test(r.pattern))
    .flatMap((r) => {
      const src = readFileSync(r.file, 'utf8');
      // One chunk per exported declaration: `export const GET = route({ … })`.
      const chunks = src.split(/export const (?=(?:GET|POST|PUT|PATCH|DELETE)\b)/).slice(1);
      return chunks.map((chunk) => ({
        method: chunk.slice(0, chunk.indexOf(' ')).trim(),
        pattern: r.pattern,
        param: r.pattern.includes('[code]') ? ('code' as const) : ('id' as const),
        kind: /notFound:\s*'([^']+)'/.exec(chunk)?.[1] ?? '(no notFound)',
        body: /\bbody:/.test(chunk),
      }));
    });
}

const calls = probedCalls();
const db = testDb();
let other: { spaceId: string; name: string; ids: Record<Kind, string>; admin: HttpSession };
const callers = new Map<Role, HttpSession>();

async function signIn(email: string, password: string): Promise<HttpSession> {
  const s = new HttpSession();
  await s.signIn(email, password);
  expect(await s.isSignedIn(), email).toBe(true);
  return s;
}

/** md5 of every row the other space owns, table by table. */
async function fingerprint(spaceId: string): Promise<Record<string, string>> {
  const out: Record<string, string> = {};
  for (const t of SPACE_TABLES) {
    const r = await sql<{ rows: string | null }>`
      select string_agg(r::text, E'\\n' order by r::text) as rows from ${sql.table(t)} r where r.space_id = ${spaceId}`.execute(db);
    out[t] = createHash('md5').update(r.rows[0].rows ?? '').digest('hex');
  }
  return out;
}

/** A space with one record of every kind, made in the database directly. */
async function otherSpace() {
  const space = await makeSpace(db, { name: `Probed space ${randomUUID().slice(0, 6)}` });
  const s = space.id;
  const admin = await makeUser(db, s, ['member', 'steward', 'treasurer', 'admin'], 'Probed admin');
  const person = await makeUser(db, s, ['member'], 'Probed member');
  const bin = await makeLocation(db, s);
  const part = await makePart(db, s, { name: 'Probed part', priceMinor: 250 });
  await makeStock(db, s, part.id, bin.id, 20);
  const unitPart = await makePart(db, s, { name: 'Probed unit part', tracking: 'unit' });
  const unit = await makeUnit(db, s, unitPart.id, bin.id);
  const heldUnit = await makeUnit(db, s, unitPart.id, bin.id);
  const template = await db.insertInto('kit_templates').values({ space_id: s, name: 'Probed kit' }).returning('id').executeTakeFirstOrThrow();
  await db.insertInto('kit_template_lines').values({ space_id: s, template_id: template.id, part_id: part.id, qty: 2 }).execute();
  const boxId = randomUUID();
  const boxCode = await makeCode(db, s, 'kit_box', boxId);
  await db.insertInto('kit_boxes').values({ id: boxId, space_id: s, template_id: template.id, code: boxCode, name: 'Probed box', location_id: bin.id }).execute();
  await db.insertInto('kit_box_contents').values({ space_id: s, kit_box_id: boxId, part_id: part.id, qty: 2 }).execute();
  const loan = await db
    .insertInto('loans')
    .values({ space_id: s, borrower_id: person.id, lent_by_id: admin.id, due_at: new Date(Date.now() + 7 * 86_400_000) })
    .returning('id')
    .executeTakeFirstOrThrow();
  await db.insertInto('loan_lines').values({ space_id: s, loan_id: loan.id, part_id: unitPart.id, unit_id: unit.id, qty: 1 }).execute();
  await db.updateTable('units').set({ state: 'out', location_id: null }).where('id', '=', unit.id).execute();
  const hold = await db.insertInto('holds').values({ space_id: s, user_id: person.id, unit_id: heldUnit.id }).returning('id').executeTakeFirstOrThrow();
  const invitation = await db
    .insertInto('invitations')
    .values({ space_id: s, email: `probed-${randomUUID().slice(0, 8)}@tests.example`, name: 'Probed guest', roles: ['member'], token_hash: randomUUID(), expires_at: new Date(Date.now() + 86_400_000) })
    .returning('id')
    .executeTakeFirstOrThrow();
  const sale = await db
    .insertInto('sales')
    .values({ space_id: s, buyer_id: person.id, cashier_id: admin.id, method: 'cash', status: 'paid', currency: 'USD', total_minor: 500, paid_at: new Date() })
    .returning('id')
    .executeTakeFirstOrThrow();
  await db.insertInto('sale_lines').values({ space_id: s, sale_id: sale.id, part_id: part.id, location_id: bin.id, qty: 2, unit_price_minor: 250 }).execute();
  const count = await db.insertInto('stock_counts').values({ space_id: s, location_id: bin.id }).returning('id').executeTakeFirstOrThrow();
  const data = Buffer.from('probed attachment');
  const attachment = await db
    .insertInto('attachments')
    .values({ space_id: s, part_id: part.id, filename: 'probed.txt', mime: 'text/plain', size_bytes: data.length, sha256: createHash('sha256').update(data).digest('hex'), data })
    .returning('id')
    .executeTakeFirstOrThrow();
  const induction = await db.insertInto('inductions').values({ space_id: s, name: 'Probed induction' }).returning('id').executeTakeFirstOrThrow();
  const signoff = await db
    .insertInto('induction_signoffs')
    .values({ space_id: s, induction_id: induction.id, user_id: person.id, signed_by: admin.id })
    .returning('id')
    .executeTakeFirstOrThrow();
  const supplier = await db.insertInto('suppliers').values({ space_id: s, name: 'Probed supplier', email: 'probed@tests.example' }).returning('id').executeTakeFirstOrThrow();
  const offer = await db
    .insertInto('supplier_offers')
    .values({ space_id: s, supplier_id: supplier.id, part_id: part.id, pack_size: 10, pack_price_minor: 500, preferred: true })
    .returning('id')
    .executeTakeFirstOrThrow();
  const order = await db
    .insertInto('order_lists')
    .values({ space_id: s, supplier_id: supplier.id, currency: 'USD', created_by: admin.id })
    .returning('id')
    .executeTakeFirstOrThrow();
  await db.insertInto('order_lines').values({ space_id: s, order_id: order.id, part_id: part.id, pack_size: 10, packs: 2, pack_price_minor: 500 }).execute();
  return {
    spaceId: s,
    name: space.name,
    ids: {
      supplier: supplier.id,
      offer: offer.id,
      order: order.id,
      attachment: attachment.id,
      hold: hold.id,
      invitation: invitation.id,
      'kit box': boxId,
      kit: template.id,
      loan: loan.id,
      location: bin.id,
      part: part.id,
      person: person.id,
      sale: sale.id,
      label: part.code!,
      count: count.id,
      unit: unit.id,
      induction: induction.id,
      'sign-off': signoff.id,
    } satisfies Record<Kind, string>,
    admin: await signIn(admin.email, admin.password),
  };
}

async function call(s: HttpSession, c: Call, value: string) {
  const key = `${c.method} ${c.pattern}`;
  const body = c.body ? BODIES[key] : undefined;
  const res = await s.fetch(concrete(c.pattern, { [c.param]: value }), {
    method: c.method,
    ...(body !== undefined ? { headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) } : {}),
  });
  return { status: res.status, text: (await res.text()).split(value).join('<id>') };
}

beforeAll(async () => {
  other = await otherSpace();
  const mine = await makeSpace(db, { name: 'Probing space' });
  for (const role of ROLES) {
    const u = await makeUser(db, mine.id, [role], `Probing ${role}`);
    callers.set(role, await signIn(u.email, u.password));
  }
}, 120_000);
afterAll(closeTestDb);

describe('the probe covers every route that names a record', () => {
  it('finds the [id] and [code] routes of the build (24 calls when this was written)', () => {
    expect(calls.length).toBeGreaterThanOrEqual(24);
  });

  it('knows the kind of record every one of them names, and has a valid body for each that takes one', () => {
    expect(calls.filter((c) => !KINDS.includes(c.kind as Kind)).map((c) => `${c.method} ${c.pattern}: ${c.kind}`)).toEqual([]);
    expect(calls.filter((c) => c.body && !(`${c.method} ${c.pattern}` in BODIES)).map((c) => `${c.method} ${c.pattern}`)).toEqual([]);
  });

  it('the records are really there: the other space’s admin reads each GET route’s record', async () => {
    for (const c of calls.filter((x) => x.method === 'GET')) {
      const res = await call(other.admin, c, other.ids[c.kind as Kind]);
      expect(res.status, `${c.method} ${c.pattern}`).toBe(200);
    }
  });
});

describe('another space’s id answers 404 to every role, carrying nothing of the record', () => {
  let before: Record<string, string>;
  beforeAll(async () => {
    before = await fingerprint(other.spaceId);
  });

  for (const c of calls) {
    it(`${c.method} ${c.pattern} (${c.kind})`, async () => {
      const target = other.ids[c.kind as Kind];
      expect(target, `no ${c.kind} to probe`).toBeTruthy();
      // A code with a valid check symbol that labels nothing, or a fresh uuid.
      const nowhere = c.param === 'code' ? newCode() : randomUUID();
      let notFound = 0;
      for (const role of ROLES) {
        const s = callers.get(role)!;
        const got = await call(s, c, target);
        const baseline = await call(s, c, nowhere);
        const who = `${role}: ${got.status} ${got.text.slice(0, 160)}`;
        expect([404, 403], who).toContain(got.status);
        // The same answer as for an id that exists nowhere: status and body.
        expect(got, who).toEqual(baseline);
        expect(got.text, who).not.toContain(other.name);
        if (got.status === 404) {
          notFound++;
          expect(JSON.parse(got.text).error.code, who).toBe('not_found');
        }
      }
      // At least one role gets past `who` to the record lookup itself.
      expect(notFound).toBeGreaterThan(0);
    });
  }

  it('nothing of the other space changed', async () => {
    expect(await fingerprint(other.spaceId)).toEqual(before);
  });
});
