import { db } from '@/db';
import { exportSpace } from '@/lib/export/space';
import { route } from '@/lib/http/route';

export const dynamic = 'force-dynamic';

// A read: it changes nothing (no audit row either; every GET is side-effect free).
export const GET = route({
  method: 'GET',
  summary: 'Everything the space owns, one CSV per table (formula-guarded) and its attachments, as one zip',
  who: ['admin'],
  produces: { contentType: 'application/zip', description: 'A zip of CSV files, as a download.' },
  run: async ({ ctx }) => {
    const { filename, zip } = await exportSpace(db, ctx);
    return new Response(zip as BodyInit, {
      headers: {
        'content-type': 'application/zip',
        'content-disposition': `attachment; filename="${filename}"`,
        'cache-control': 'no-store',
      },
    });
  },
});
