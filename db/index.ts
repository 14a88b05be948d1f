import 'server-only';
import { createDb, type Db } from './connect';
import { env } from '@/lib/env';

// Cached on globalThis so dev hot reload does not open a new pool each time.
const globalForDb = globalThis as unknown as { ohmsteadDb?: Db };

export const db: Db = globalForDb.ohmsteadDb ?? createDb(env().DATABASE_URL);
if (env().NODE_ENV !== 'production') globalForDb.ohmsteadDb = db;

export type { Db } from './connect';
