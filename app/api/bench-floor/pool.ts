import type { Pool } from 'pg';
import { NextResponse } from 'next/server';
import { floorPool } from '@/bench/floor-sql';
import { errorBody } from '@/lib/http/respond';

// Shared by the framework-floor route handlers (bench/ baselines). They exist only while the server
// runs with OHM_BENCH=1, which only scripts/bench.sh sets; otherwise every one of them answers 404.
export const benchOn = () => process.env.OHM_BENCH === '1';
export const notHere = () => NextResponse.json(errorBody('not_found', 'Not found.'), { status: 404 });

const g = globalThis as typeof globalThis & { ohmBenchFloorPool?: Pool };
export const pool = (): Pool => (g.ohmBenchFloorPool ??= floorPool(process.env.DATABASE_URL!));
