import { z } from 'zod';
import { env } from '@/lib/env';
import { openApiDocument } from '@/lib/http/openapi';
import { route } from '@/lib/http/route';
import { ROUTES } from '../_declared/routes';

export const dynamic = 'force-dynamic';

type Doc = ReturnType<typeof openApiDocument>;
let cached: Doc | undefined;

export const GET = route({
  method: 'GET',
  summary: 'This document: every route of the API in OpenAPI 3.1, generated from the declarations',
  who: 'signed-in',
  response: z.looseObject({ openapi: z.literal('3.1.0') }),
  // Built on first request (every route module is loaded by then), then kept: the routes are fixed per build.
  run: async () => (cached ??= openApiDocument(ROUTES, env().APP_BASE_URL)),
});
