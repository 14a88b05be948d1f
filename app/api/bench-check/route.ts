import { NextResponse } from 'next/server';
import { benchCheck, readJson } from '@/lib/bench-check';
import { handle } from '@/lib/http/respond';

// Public: anyone may check a build (no sign-in, no database). Body: a KitSpec; answer: the KitReport,
// with the safety cautions alongside. Bad input is a 400 naming each field.
export const POST = handle(async (req: Request) => NextResponse.json(benchCheck(await readJson(req))));
