import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { supplierPatchSchema } from '@/lib/restock/schemas';
import { updateSupplier } from '@/lib/restock/suppliers';

export const PATCH = route({
  method: 'PATCH',
  summary: 'Changes a supplier’s details, or archives or restores it',
  who: STAFF,
  params: idParams,
  notFound: 'supplier',
  body: json(supplierPatchSchema),
  response: one('supplier', 'The supplier.'),
  run: ({ ctx, params, body }) => updateSupplier(db, ctx, params.id, body),
});
