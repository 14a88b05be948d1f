import { NextResponse } from 'next/server';
import { benchCompare, readJson } from '@/lib/bench-check';
import { handle } from '@/lib/http/respond';

// Public: buck vs linear vs series resistor for one string on one supply. Bad input is a 400 naming each field.
export const POST = handle(async (req: Request) => NextResponse.json(benchCompare(await readJson(req))));
