import { notFound, redirect } from 'next/navigation';
import { db } from '@/db';
import { codeFromScan } from '@/labels/url';
import { requirePageUser } from '@/lib/auth/guard';
import { NotFoundError } from '@/lib/errors';
import { resolveCode } from '@/lib/inventory/resolve';

// A label's QR holds <base>/s/<code>: a phone's own camera lands here and is sent to the thing's page.
// A code that does not add up goes to the scan page, which offers "did you mean".
export default async function ScanRedirect({ params }: { params: Promise<{ code: string }> }) {
  const ctx = await requirePageUser();
  const { code: raw } = await params;
  let code: string;
  try {
    code = decodeURIComponent(raw);
  } catch {
    code = raw;
  }
  if (!codeFromScan(code).ok) redirect(`/scan?code=${encodeURIComponent(code.slice(0, 40))}`);
  let href: string;
  try {
    href = (await resolveCode(db, ctx, code)).href;
  } catch (err) {
    if (err instanceof NotFoundError) notFound();
    throw err;
  }
  redirect(href);
}
