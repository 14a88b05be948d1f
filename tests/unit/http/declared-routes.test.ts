import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { apiRoutes, openApiPath } from '../../helpers/routes';

// Every route file under app/api is made of route() declarations, and every one of the production build
// is in the list the API document is generated from (app/api/_declared/routes.ts). A route file without
// a declaration, or left out of the list, fails here (and lint fails on the file itself).
const ROOT = path.resolve(__dirname, '../../..');
const registry = readFileSync(path.join(ROOT, 'app/api/_declared/routes.ts'), 'utf8');
const METHOD = /^export\s+(?:const|let|var|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE|HEAD|OPTIONS)\b(.*)$/gm;

describe('route declarations', () => {
  const routes = apiRoutes();

  it('finds the route files', () => {
    expect(routes.length).toBeGreaterThan(50);
  });

  for (const r of routes) {
    const rel = path.relative(ROOT, r.file);
    it(`${rel}: every exported method is route({ method }) with the same name`, () => {
      const src = readFileSync(r.file, 'utf8');
      expect(src).not.toMatch(/export\s*\{[^}]*\b(GET|POST|PUT|PATCH|DELETE)\b[^}]*\}/);
      const exported = [...src.matchAll(METHOD)];
      expect(exported.length).toBeGreaterThan(0);
      for (const [, name, rest] of exported) {
        expect(rest.trim(), `${name} must be \`= route({\``).toBe('= route({');
        const declaration = src.slice(src.indexOf(`export const ${name} = route({`)).split('\n').slice(0, 3).join('\n');
        expect(declaration, `${name} declares method '${name}'`).toContain(`method: '${name}'`);
      }
    });

    if (r.door === 'app') {
      it(`${rel}: is listed for the API document as ${openApiPath(r.pattern)}`, () => {
        const importPath = `../${path.relative(path.join(ROOT, 'app/api'), r.file).replace(/\.ts$/, '')}`;
        expect(registry).toContain(`'${openApiPath(r.pattern)}': `);
        expect(registry).toContain(`from '${importPath}'`);
      });
    }
  }

  it('the list holds no route that is gone', () => {
    const listed = [...registry.matchAll(/^ {2}'([^']+)': /gm)].map((m) => m[1]);
    const onDisk = routes.filter((r) => r.door === 'app').map((r) => openApiPath(r.pattern));
    expect(listed.sort()).toEqual(onDisk.sort());
  });
});

// Modules that reach the database (or its secrets) carry `import 'server-only'`, so no client bundle
// can pull them in. The few the seed and bench scripts also run outside Next are listed with that reason.
const RUN_BY_SCRIPTS = new Set([
  'db/connect.ts', 'lib/audit/log.ts', 'lib/sales/access.ts', 'lib/sales/basket.ts', 'lib/sales/cash.ts',
  'lib/sales/paid.ts', 'lib/sales/periods.ts', 'lib/sales/refunds.ts', 'lib/sales/stock.ts', 'lib/payments/stripe.ts',
  'lib/money-rules/settings.ts', // the tax rule a cash sale is written under (the seed writes cash sales)
  'lib/settings/section.ts', // reads and patches a settings key (the money rules the seed's cash sales use)
]);

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((n) => {
    const full = path.join(dir, n);
    if (statSync(full).isDirectory()) return ['migrations', 'seed'].includes(n) ? [] : files(full);
    return /\.tsx?$/.test(n) ? [full] : [];
  });
}

describe('server-only', () => {
  const touching = [...files(path.join(ROOT, 'lib')), ...files(path.join(ROOT, 'db'))].filter((f) =>
    /from '@\/db'|from '@\/db\/connect'|from '\.\/connect'|env\(\)\.(NEXTAUTH_SECRET|STRIPE_SECRET_KEY|STRIPE_WEBHOOK_SECRET|DATABASE_URL)/.test(
      readFileSync(f, 'utf8'),
    ),
  );

  it('finds the modules that touch the database', () => {
    expect(touching.length).toBeGreaterThan(40);
  });

  for (const f of touching) {
    const rel = path.relative(ROOT, f);
    if (RUN_BY_SCRIPTS.has(rel)) continue;
    it(`${rel} imports server-only`, () => {
      expect(readFileSync(f, 'utf8')).toMatch(/^import 'server-only';$/m);
    });
  }
});
