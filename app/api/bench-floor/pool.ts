import 'server-only';
import type { Pool } from 'pg';
import { env } from '@/lib/env';
import { NotFoundError } from '@/lib/errors';
import { floorPool } from './floor-sql';

// Shared by the framework-floor route handlers (bench/ baselines). Their files (route.benchonly.ts) are
// compiled only into the build scripts/bench.sh makes, and even there they answer 404 unless the server
// runs with OHM_BENCH=1.
export function requireBench(): void {
  if (env().OHM_BENCH !== '1') throw new NotFoundError();
}

const g = globalThis as typeof globalThis & { ohmBenchFloorPool?: Pool };
export const pool = (): Pool => (g.ohmBenchFloorPool ??= floorPool(env().DATABASE_URL));
