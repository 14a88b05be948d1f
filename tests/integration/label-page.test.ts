import { Kysely, PostgresDialect, type LogEvent } from 'kysely';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Database } from '@/db/types';
import type { Ctx } from '@/lib/auth/roles';
import { partPage } from '@/lib/inventory/part-page';
import { resolveCode } from '@/lib/inventory/resolve';
import { boxPage } from '@/lib/kits/box-page';
import { closeTestDb, makeLocation, makeSpace, makeUser, testDb } from '../helpers/db';
import { signedIn, type HttpSession } from '../helpers/http';

// The page a label's QR opens (/s/<code>): a kit box or a part is rendered right there on the server, its
// verdict in the first answer (no redirect), in a counted number of queries; a bin still goes to its page,
// and another space's label is the not-found page. Queries are counted with Kysely's own query log.

const db = testDb();
let pool: pg.Pool;
let logged: Kysely<Database>;
const statements: string[] = [];
let box: { id: string; code: string; name: string };
let part: { id: string; code: string; name: string };
let ctx: Ctx;
let member: HttpSession;
let outsider: HttpSession;

// The budgets the label page is held to, at what it takes today (a member opening the label). A kit box: the
// session (1, in the guard), the label (1), the box and its contents (2, read once for the page and the check
// alike: lib/kits/box-page.ts hands them to the check), its loan, holds and shortfall (3), and the check's
// rules, inductions (2), holds ready, standing and open loans (6): 13, two fewer than when the box page and
// its check each read the box and its contents. A part: the session, the label, the part with its stock,
// units, movements, files and space, and the label layout (7). A change that adds a query to either path must
// say why here.
const BOX_LABEL_QUERIES = 13;
const PART_LABEL_QUERIES = 9;

beforeAll(async () => {
  const space = await db.selectFrom('spaces').select(['id', 'name']).where('slug', '=', 'quillmere').executeTakeFirstOrThrow();
  box = await db
    .selectFrom('kit_boxes')
    .select(['id', 'code', 'name'])
    .where('space_id', '=', space.id)
    .orderBy('name')
    .executeTakeFirstOrThrow();
  const labelled = await db
    .selectFrom('label_codes')
    .innerJoin('parts', 'parts.id', 'label_codes.target_id')
    .select(['parts.id', 'label_codes.code', 'parts.name'])
    .where('label_codes.space_id', '=', space.id)
    .where('label_codes.kind', '=', 'part')
    .orderBy('label_codes.code')
    .executeTakeFirstOrThrow();
  part = labelled;
  const m = await makeUser(db, space.id, ['member'], 'Pell Quarrington');
  ctx = { userId: m.id, email: m.email, name: m.name, spaceId: space.id, spaceName: space.name, roles: ['member'], spaces: [{ id: space.id, name: space.name, roles: ['member'] }] };
  const other = await makeSpace(db);
  const o = await makeUser(db, other.id, ['member']);
  [member, outsider] = await Promise.all([signedIn(m.email, m.password), signedIn(o.email, o.password)]);
  pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 4 });
  logged = new Kysely<Database>({
    dialect: new PostgresDialect({ pool }),
    log: (e: LogEvent) => {
      if (e.level === 'query') statements.push(e.query.sql);
    },
  });
});

afterAll(async () => {
  await logged?.destroy();
  await closeTestDb();
});

describe('the label page', () => {
  test(`a kit box's label: the verdict in at most ${BOX_LABEL_QUERIES - 1} queries after the session`, async () => {
    statements.length = 0;
    const found = await resolveCode(logged, ctx, box.code);
    expect(found).toMatchObject({ kind: 'kit_box', targetId: box.id });
    const data = await boxPage(logged, ctx, found.targetId);
    expect(['ok', 'caution', 'fail']).toContain(data.preview.outcome.verdict);
    expect(data.box.name).toBe(box.name);
    // A member gets neither the people to lend to nor the upkeep moves, and no query is spent on them.
    expect(data.members).toEqual([]);
    expect(data.upkeep).toBeNull();
    expect(statements.some((s) => /from "memberships"/.test(s) && !/"users"/.test(s))).toBe(false);
    // The box and its contents are read once, for the page and the check alike.
    expect(statements.filter((s) => /from "kit_boxes"/.test(s)), statements.join('\n')).toHaveLength(1);
    expect(statements.filter((s) => /from "kit_box_contents"/.test(s)), statements.join('\n')).toHaveLength(1);
    // + 1: the guard's one query for the person and the session (lib/auth/guard.ts), not on this handle.
    console.log(`label page, kit box: ${statements.length + 1} queries (budget ${BOX_LABEL_QUERIES})`);
    expect(statements.length + 1, statements.join('\n')).toBeLessThanOrEqual(BOX_LABEL_QUERIES);
  });

  test(`a part's label: the page in at most ${PART_LABEL_QUERIES - 1} queries after the session`, async () => {
    statements.length = 0;
    const found = await resolveCode(logged, ctx, part.code);
    expect(found).toMatchObject({ kind: 'part', targetId: part.id });
    const data = await partPage(logged, ctx, found.targetId);
    expect(data.detail.part.name).toBe(part.name);
    expect(data.qr).toContain('<svg');
    console.log(`label page, part: ${statements.length + 1} queries (budget ${PART_LABEL_QUERIES})`);
    expect(statements.length + 1, statements.join('\n')).toBeLessThanOrEqual(PART_LABEL_QUERIES);
  });

  test('served: /s/<box code> answers the box with its verdict itself (200, no redirect)', async () => {
    const res = await member.get(`/s/${box.code}`);
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toMatch(/data-verdict="(ok|caution|fail)"/);
    expect(html).toContain(box.name);
    expect(html).toContain('<title>Kit box');
    // The app's frame (header and section navigation) is there, as on every signed-in page.
    expect(html).toMatch(/aria-label="Main sections"/);
  });

  test('served: /s/<part code> answers the part page itself', async () => {
    const res = await member.get(`/s/${part.code.toLowerCase()}`);
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain(part.name);
    expect(html).toContain('<title>Part');
  });

  test('served: a bin still goes to its page; another space’s box is the not-found page', async () => {
    const bin = await makeLocation(db, ctx.spaceId);
    const res = await member.get(`/s/${bin.code}`);
    expect([307, 308]).toContain(res.status);
    expect(res.headers.get('location')).toMatch(new RegExp(`/shelf/locations/${bin.id}$`));
    const theirs = await outsider.get(`/s/${box.code}`);
    expect(theirs.status).toBe(404);
    expect(await theirs.text()).not.toContain(box.name);
  });
});
