// The raw floor of bench/: a bare node:http server running the same SQL as the benchmarked routes
// through `pg` (app/api/bench-floor/floor-sql.ts) — the physical limit of this machine for that work.
//   DATABASE_URL=… npx tsx bench/raw-floor.ts [port]     GET /scan/<code> · POST /loans
import http from 'node:http';
import { borrowCounted, floorPool, lookupByCode, type BorrowInput } from '../app/api/bench-floor/floor-sql';

const pool = floorPool(process.env.DATABASE_URL ?? '');
const port = Number(process.argv[2] ?? process.env.BENCH_RAW_PORT ?? 0);

function send(res: http.ServerResponse, status: number, body: unknown) {
  const text = JSON.stringify(body);
  res.writeHead(status, { 'content-type': 'application/json', 'content-length': Buffer.byteLength(text) });
  res.end(text);
}

async function route(req: http.IncomingMessage, res: http.ServerResponse) {
  const url = req.url ?? '/';
  if (req.method === 'GET' && url.startsWith('/scan/')) {
    const found = await lookupByCode(pool, decodeURIComponent(url.slice('/scan/'.length)));
    return found ? send(res, 200, found) : send(res, 404, { error: { code: 'not_found' } });
  }
  if (req.method === 'POST' && url === '/loans') {
    const chunks: Buffer[] = [];
    for await (const c of req) chunks.push(c as Buffer);
    const result = await borrowCounted(pool, JSON.parse(Buffer.concat(chunks).toString('utf8')) as BorrowInput);
    return 'conflict' in result ? send(res, 409, { error: { code: 'conflict', message: result.conflict } }) : send(res, 201, { loan: result });
  }
  if (url === '/health') return send(res, 200, { ok: true });
  send(res, 404, { error: { code: 'not_found' } });
}

const server = http.createServer((req, res) => {
  route(req, res).catch((err: unknown) => send(res, 500, { error: { code: 'internal', message: String(err) } }));
});
server.keepAliveTimeout = 30_000;
server.listen(port, '127.0.0.1', () => {
  console.log(`raw floor on http://127.0.0.1:${(server.address() as { port: number }).port}`);
});
for (const sig of ['SIGINT', 'SIGTERM'] as const)
  process.once(sig, () => {
    server.close();
    void pool.end().finally(() => process.exit(0));
  });
