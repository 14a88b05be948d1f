import { describe, expect, it } from 'vitest';
import { adjustSchema, moveSchema, partCreateSchema, partListQuerySchema } from '@/lib/inventory/schemas';
import { hrefFor } from '@/lib/inventory/resolve';

const A = '00000000-0000-4000-8000-00000000000a';
const B = '00000000-0000-4000-8000-00000000000b';

describe('partListQuerySchema', () => {
  it('reads a query string: blanks are "not given", below=1 is true, paging has bounds', () => {
    expect(partListQuerySchema.parse({ q: '', category: '', below: '1', page: '3' })).toEqual({
      q: undefined,
      category: undefined,
      tracking: undefined,
      below: true,
      sort: 'name',
      dir: 'asc',
      page: 3,
      pageSize: 50,
    });
    expect(partListQuerySchema.safeParse({ pageSize: '5000' }).success).toBe(false);
    expect(partListQuerySchema.safeParse({ sort: 'price; drop table parts' }).success).toBe(false);
  });
});

describe('stock inputs', () => {
  it('refuses a move into the same bin, naming toLocationId', () => {
    const r = moveSchema.safeParse({ partId: A, fromLocationId: B, toLocationId: B, qty: 1 });
    expect(r.success).toBe(false);
    if (!r.success) expect(r.error.issues[0].path).toEqual(['toLocationId']);
  });

  it('refuses more than three decimals, zero quantities and an adjustment without a reason', () => {
    // 1.5 m of wire is a quantity (migration 0014); whether the part takes fractions is the service's check.
    expect(moveSchema.safeParse({ partId: A, fromLocationId: A, toLocationId: B, qty: 1.5 }).success).toBe(true);
    const four = moveSchema.safeParse({ partId: A, fromLocationId: A, toLocationId: B, qty: 1.0005 });
    expect(four.success).toBe(false);
    if (!four.success) expect(four.error.issues[0]).toMatchObject({ path: ['qty'], message: 'quantity may have at most 3 decimals' });
    expect(moveSchema.safeParse({ partId: A, fromLocationId: A, toLocationId: B, qty: 0 }).success).toBe(
      false,
    );
    const r = adjustSchema.safeParse({ partId: A, locationId: B, delta: -2, note: '' });
    expect(r.success).toBe(false);
    if (!r.success) expect(r.error.issues.map((i) => i.path.join('.'))).toEqual(['note']);
  });

  it('needs a tracking choice and a valid SKU to create a part', () => {
    const r = partCreateSchema.safeParse({ sku: 'has space', name: 'x', category: 'led' });
    expect(r.success).toBe(false);
    if (!r.success) expect(r.error.issues.map((i) => i.path.join('.')).sort()).toEqual(['sku', 'tracking']);
  });
});

describe('hrefFor', () => {
  it('sends each kind of label to its page, a unit to its part with the unit marked', () => {
    expect(hrefFor('unit', A, { partId: B, code: 'K7F2QX9' })).toBe(
      `/shelf/parts/${B}?unit=K7F2QX9#unit-K7F2QX9`,
    );
    expect(hrefFor('part', A)).toBe(`/shelf/parts/${A}`);
    expect(hrefFor('location', A)).toBe(`/shelf/locations/${A}`);
    expect(hrefFor('kit_box', A)).toBe(`/kits/boxes/${A}`);
  });
});
