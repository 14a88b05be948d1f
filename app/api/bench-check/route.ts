import { NextResponse } from 'next/server';
import { checkKit, kitSpecSchema, safetyCautions } from '@/lib/electrical';
import { handle, parseJsonBody } from '@/lib/http/respond';

// Public: anyone may check a build (no sign-in, no database). Body: a KitSpec; answer: the KitReport,
// with the safety cautions alongside. Bad input is a 400 naming each field.
export const POST = handle(async (req: Request) => {
  const spec = await parseJsonBody(req, kitSpecSchema);
  const report = checkKit(spec);
  return NextResponse.json({ ...report, cautions: safetyCautions(spec, report) });
});
