import Link from 'next/link';
import { PageTitle } from '@/components/ui/page-title';
import { requirePageRole } from '@/lib/auth/guard';
import { env } from '@/lib/env';
import { openApiDocument } from '@/lib/http/openapi';
import { ROUTES } from '../../../api/_declared/routes';

export const metadata = { title: 'API reference' };

type Schema = { type?: string | string[]; format?: string; enum?: unknown[]; properties?: Record<string, Schema>; required?: string[]; anyOf?: Schema[]; items?: Schema; $ref?: string; description?: string };
type Operation = {
  summary?: string;
  description?: string;
  'x-ohm-who'?: string | string[];
  parameters?: { name: string; in: string; required?: boolean; schema?: Schema }[];
  requestBody?: { content: Record<string, { schema?: Schema }> };
  responses: Record<string, { description: string; content?: Record<string, unknown> }>;
};

const METHOD_STYLE: Record<string, string> = {
  get: 'bg-sky-100 text-sky-900 dark:bg-sky-900 dark:text-sky-100',
  post: 'bg-emerald-100 text-emerald-900 dark:bg-emerald-900 dark:text-emerald-100',
  put: 'bg-amber-100 text-amber-900 dark:bg-amber-900 dark:text-amber-100',
  patch: 'bg-amber-100 text-amber-900 dark:bg-amber-900 dark:text-amber-100',
  delete: 'bg-rose-100 text-rose-900 dark:bg-rose-900 dark:text-rose-100',
};

function typeOf(s: Schema | undefined): string {
  if (!s) return 'any';
  if (s.$ref) return s.$ref.split('/').pop() ?? 'object';
  if (s.enum) return s.enum.map((v) => JSON.stringify(v)).join(' | ');
  if (s.anyOf) return s.anyOf.map(typeOf).join(' or ');
  if (s.type === 'array') return `${typeOf(s.items)}[]`;
  const t = Array.isArray(s.type) ? s.type.join(' | ') : (s.type ?? 'object');
  return s.format ? `${t} (${s.format})` : t;
}

function who(op: Operation): string {
  const w = op['x-ohm-who'];
  if (Array.isArray(w)) return w.join(' or ');
  return w === 'anonymous' ? 'anyone' : w === 'signed-in' ? 'anyone signed in' : w === 'signature' ? 'signed by the processor' : String(w);
}

function Fields({ schema }: { schema?: Schema }) {
  const shapes = schema?.anyOf ?? [schema];
  return (
    <>
      {shapes.map((s, i) =>
        s?.properties ? (
          <ul key={i} className="mt-1 space-y-0.5 text-sm">
            {i > 0 ? <li className="muted">or</li> : null}
            {Object.entries(s.properties).map(([name, p]) => (
              <li key={name} className="break-words">
                <code className="font-semibold">{name}</code>
                {s.required?.includes(name) ? '' : '?'}: <span className="muted">{typeOf(p)}</span>
              </li>
            ))}
          </ul>
        ) : (
          <p key={i} className="muted text-sm">{typeOf(s)}</p>
        ),
      )}
    </>
  );
}

function OperationCard({ method, path, op }: { method: string; path: string; op: Operation }) {
  const body = op.requestBody ? Object.entries(op.requestBody.content)[0] : undefined;
  const statuses = Object.entries(op.responses);
  return (
    <details className="card min-w-0 p-3">
      <summary className="flex cursor-pointer flex-wrap items-baseline gap-2">
        <span className={`rounded px-1.5 py-0.5 text-xs font-bold uppercase ${METHOD_STYLE[method] ?? ''}`}>{method}</span>
        <code className="min-w-0 break-all text-sm font-semibold">{path}</code>
        <span className="w-full text-sm">{op.summary}</span>
      </summary>
      <dl className="mt-3 grid gap-2 text-sm">
        <div>
          <dt className="font-semibold">Who may call</dt>
          <dd>{who(op)}</dd>
        </div>
        {op.parameters?.length ? (
          <div>
            <dt className="font-semibold">Parameters</dt>
            <dd>
              <ul className="space-y-0.5">
                {op.parameters.map((p) => (
                  <li key={`${p.in}:${p.name}`} className="break-words">
                    <code>{p.name}</code> ({p.in}{p.required ? ', required' : ''}): <span className="muted">{typeOf(p.schema)}</span>
                  </li>
                ))}
              </ul>
            </dd>
          </div>
        ) : null}
        {body ? (
          <div>
            <dt className="font-semibold">Body ({body[0]})</dt>
            <dd>
              <Fields schema={body[1].schema} />
            </dd>
          </div>
        ) : null}
        <div>
          <dt className="font-semibold">Answers</dt>
          <dd>
            <ul className="space-y-0.5">
              {statuses.map(([status, r]) => (
                <li key={status}>
                  <code>{status}</code> {r.description}
                  {r.content ? <span className="muted"> ({Object.keys(r.content).join(', ')})</span> : null}
                </li>
              ))}
            </ul>
          </dd>
        </div>
      </dl>
    </details>
  );
}

// The API reference, read from the same generated document that /api/openapi.json serves.
export default async function ApiReferencePage() {
  await requirePageRole('admin');
  const doc = openApiDocument(ROUTES, env().APP_BASE_URL) as unknown as { paths: Record<string, Record<string, Operation>> };
  const byTag = new Map<string, { method: string; path: string; op: Operation }[]>();
  for (const [path, item] of Object.entries(doc.paths)) {
    for (const [method, op] of Object.entries(item)) {
      const tag = path.split('/')[2] ?? 'api';
      byTag.set(tag, [...(byTag.get(tag) ?? []), { method, path, op }]);
    }
  }
  return (
    <div className="mx-auto min-w-0 max-w-3xl wrap-anywhere">
      <PageTitle
        title="API reference"
        lead="Every route of this installation, generated from the routes’ own declarations. Errors answer { error: { code, message, fields } }."
      >
        <a className="btn-quiet" href="/api/openapi.json">
          OpenAPI 3.1 (JSON)
        </a>
        <Link className="btn-quiet" href="/settings">
          Back to Settings
        </Link>
      </PageTitle>
      {[...byTag].map(([tag, ops]) => (
        <section key={tag} className="mb-5">
          <h2 className="mb-2 text-lg font-semibold">{tag}</h2>
          <div className="grid min-w-0 grid-cols-1 gap-2">
            {ops.map((o) => (
              <OperationCard key={`${o.method} ${o.path}`} {...o} />
            ))}
          </div>
        </section>
      ))}
    </div>
  );
}
