import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { PDFDocument } from 'pdf-lib';
import { PNG } from 'pngjs';
import { closeTestDb, makePart, makeSpace, makeUser, testDb } from '../helpers/db';
import { signedIn, type HttpSession } from '../helpers/http';

// Uploads judged by their bytes, stored in PostgreSQL, served with headers that stop a browser from
// running or sniffing them. Real multipart over real HTTP.

const db = testDb();
let steward: HttpSession;
let member: HttpSession;
let outsider: HttpSession;
let partId: string;

type ErrorBody = { error: { code: string; fields: Record<string, string[]> } };

beforeAll(async () => {
  const space = await makeSpace(db);
  const other = await makeSpace(db);
  const s = await makeUser(db, space.id, ['steward']);
  const m = await makeUser(db, space.id, ['member']);
  const o = await makeUser(db, other.id, ['steward']);
  [steward, member, outsider] = await Promise.all([
    signedIn(s.email, s.password),
    signedIn(m.email, m.password),
    signedIn(o.email, o.password),
  ]);
  partId = (await makePart(db, space.id, { name: 'Part with a datasheet' })).id;
});
afterAll(closeTestDb);

function pngBytes(): Uint8Array {
  const img = new PNG({ width: 4, height: 4 });
  img.data.fill(128);
  return new Uint8Array(PNG.sync.write(img));
}
async function pdfBytes(): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  doc.addPage([200, 200]);
  return doc.save();
}

function upload(session: HttpSession, bytes: Uint8Array, filename: string, type: string, part = partId) {
  const form = new FormData();
  form.set('partId', part);
  form.set('file', new Blob([new Uint8Array(bytes)], { type }), filename);
  return session.fetch('/api/attachments', { method: 'POST', body: form });
}

async function fileError(res: Response): Promise<string[]> {
  return ((await res.json()) as ErrorBody).error.fields?.file ?? [];
}

describe('uploads', () => {
  test('a PNG photo is stored and served inline as image/png with safe headers', async () => {
    const bytes = pngBytes();
    const res = await upload(steward, bytes, 'bench photo.png', 'image/png');
    expect(res.status).toBe(201);
    const saved = (await res.json()) as { id: string; mime: string; filename: string };
    expect(saved).toMatchObject({ mime: 'image/png', filename: 'bench photo.png' });
    const row = await db
      .selectFrom('attachments')
      .select(['size_bytes', 'sha256'])
      .where('id', '=', saved.id)
      .executeTakeFirstOrThrow();
    expect(row.size_bytes).toBe(bytes.byteLength);

    const got = await member.get(`/api/attachments/${saved.id}`);
    expect(got.status).toBe(200);
    expect(got.headers.get('content-type')).toBe('image/png');
    expect(got.headers.get('x-content-type-options')).toBe('nosniff');
    expect(got.headers.get('content-security-policy')).toMatch(/^default-src 'none'/);
    expect(got.headers.get('content-disposition')).toMatch(/^inline;/);
    expect(new Uint8Array(await got.arrayBuffer())).toEqual(bytes);
  });

  test('a PDF datasheet is served as a download, whatever the browser claimed its type was', async () => {
    const res = await upload(steward, await pdfBytes(), 'datasheet.bin', 'application/octet-stream');
    expect(res.status).toBe(201);
    const saved = (await res.json()) as { id: string; mime: string; filename: string };
    expect(saved).toMatchObject({ mime: 'application/pdf', filename: 'datasheet.pdf' });
    const got = await steward.get(`/api/attachments/${saved.id}`);
    expect(got.headers.get('content-type')).toBe('application/pdf');
    expect(got.headers.get('content-disposition')).toMatch(/^attachment;/);
  });

  test('a script disguised as a .png is refused with 400 naming file', async () => {
    const res = await upload(
      steward,
      new TextEncoder().encode('<script>fetch("/api/parts")</script>'),
      'cute-cat.png',
      'image/png',
    );
    expect(res.status).toBe(400);
    expect((await fileError(res)).join()).toMatch(/only PDF datasheets and JPEG, PNG or WebP photos/);
  });

  test('HTML claiming to be a PDF, and a ZIP, are refused by content', async () => {
    const html = await upload(
      steward,
      new TextEncoder().encode('<!doctype html><h1>hi</h1>'),
      'sheet.pdf',
      'application/pdf',
    );
    expect(html.status).toBe(400);
    expect(await fileError(html)).toHaveLength(1);
    const zip = await upload(
      steward,
      new Uint8Array([0x50, 0x4b, 0x03, 0x04, ...new Array(100).fill(0)]),
      'photo.jpg',
      'image/jpeg',
    );
    expect(zip.status).toBe(400);
    expect((await fileError(zip)).join()).toMatch(/ZIP/);
  });

  test('a file over 5 MB is refused with 413 naming file, and nothing is stored', async () => {
    const big = new Uint8Array(5 * 1024 * 1024 + 1);
    big.set(pngBytes());
    const before = await db.selectFrom('attachments').select('id').where('part_id', '=', partId).execute();
    const res = await upload(steward, big, 'huge.png', 'image/png');
    expect(res.status).toBe(413);
    expect((await fileError(res)).join()).toMatch(/larger than 5 MB/);
    expect(
      await db.selectFrom('attachments').select('id').where('part_id', '=', partId).execute(),
    ).toHaveLength(before.length);
  });

  test('a request without a file or part is a 400 naming the missing field', async () => {
    const form = new FormData();
    form.set('partId', partId);
    const res = await steward.fetch('/api/attachments', { method: 'POST', body: form });
    expect(res.status).toBe(400);
    expect(((await res.json()) as ErrorBody).error.fields).toHaveProperty('file');
  });

  test('members may read but not upload or delete (403)', async () => {
    expect((await upload(member, pngBytes(), 'x.png', 'image/png')).status).toBe(403);
    const own = (await (await upload(steward, pngBytes(), 'keep.png', 'image/png')).json()) as { id: string };
    expect((await member.fetch(`/api/attachments/${own.id}`, { method: 'DELETE' })).status).toBe(403);
    expect((await steward.fetch(`/api/attachments/${own.id}`, { method: 'DELETE' })).status).toBe(200);
    expect((await steward.get(`/api/attachments/${own.id}`)).status).toBe(404);
  });

  test('another space neither sees the file nor attaches to the part (404)', async () => {
    const saved = (await (await upload(steward, pngBytes(), 'private.png', 'image/png')).json()) as {
      id: string;
    };
    expect((await outsider.get(`/api/attachments/${saved.id}`)).status).toBe(404);
    expect((await outsider.fetch(`/api/attachments/${saved.id}`, { method: 'DELETE' })).status).toBe(404);
    expect((await upload(outsider, pngBytes(), 'sneaky.png', 'image/png')).status).toBe(404);
  });
});
