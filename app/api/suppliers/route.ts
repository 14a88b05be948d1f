import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { listOf, one } from '@/lib/http/shapes';
import { supplierSchema } from '@/lib/restock/schemas';
import { createSupplier, listSuppliers } from '@/lib/restock/suppliers';

export const GET = route({
  method: 'GET',
  summary: 'The space’s suppliers, each with its offers (pack sizes, prices per pack)',
  who: STAFF,
  response: listOf('suppliers', 'A supplier and its offers.'),
  run: async ({ ctx }) => ({ suppliers: await listSuppliers(db, ctx) }),
});

export const POST = route({
  method: 'POST',
  summary: 'Adds a supplier (name, website, contact e-mail, lead time, minimum order, notes)',
  who: STAFF,
  body: json(supplierSchema),
  status: 201,
  response: one('supplier', 'The new supplier.'),
  run: ({ ctx, body }) => createSupplier(db, ctx, body),
});
