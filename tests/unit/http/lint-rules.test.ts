import path from 'node:path';
import { ESLint } from 'eslint';
import { beforeAll, describe, expect, it } from 'vitest';

// The layer and route rules of eslint.config.mjs, run on small files placed where they would live: each
// broken rule must be reported, and the house's own way must pass.
const root = path.resolve(__dirname, '../../..');
const eslint = new ESLint({ cwd: root });

async function messages(file: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: path.join(root, file) });
  return result.messages.map((m) => `${m.ruleId}: ${m.message}`);
}

// Loading the Next and TypeScript rule sets takes a few seconds on a busy machine: once, up front.
beforeAll(() => messages('lib/example.ts', 'export {};\n'), 60_000);

describe('route handlers', () => {
  it('a handler written by hand fails lint', async () => {
    const out = await messages(
      'app/api/example/route.ts',
      `import { NextResponse } from 'next/server';\nexport async function GET() { return NextResponse.json({}); }\n`,
    );
    expect(out.join('\n')).toMatch(/no-restricted-syntax: Declare every route handler with route\(\)/);
  });

  it('a handler exported under another name, or made with handle(), fails lint', async () => {
    const out = await messages(
      'app/api/example/route.ts',
      `import { handle } from '@/lib/http/respond';\nconst h = handle(async () => new Response());\nexport { h as POST };\nexport const GET = handle(async () => new Response());\n`,
    );
    expect(out.filter((m) => m.includes('Declare every route handler')).length).toBe(2);
    expect(out.join('\n')).toMatch(/no-restricted-imports: .*lib\/http\/respond/);
  });

  it('SQL in a handler fails lint', async () => {
    const out = await messages(
      'app/api/example/route.ts',
      `import { db } from '@/db';\nimport { route } from '@/lib/http/route';\nexport const GET = route({ method: 'GET', summary: 'x', who: 'signed-in', run: () => db.selectFrom('parts').selectAll().execute() });\n`,
    );
    expect(out.join('\n')).toMatch(/No SQL in route handlers/);
  });

  it('a declared handler passes', async () => {
    const out = await messages(
      'app/api/example/route.ts',
      `import { route } from '@/lib/http/route';\nexport const GET = route({ method: 'GET', summary: 'x', who: 'anonymous', run: async () => ({ ok: true }) });\n`,
    );
    expect(out).toEqual([]);
  });
});

describe('layers', () => {
  it('lib/electrical imports nothing of ours', async () => {
    expect((await messages('lib/electrical/example.ts', `import { db } from '@/db';\nexport const x = db;\n`)).join()).toMatch(
      /lib\/electrical imports nothing of ours/,
    );
    expect(await messages('lib/electrical/example.ts', `import { z } from 'zod';\nimport { volts } from './schema';\nexport const x = [z, volts];\n`)).toEqual([]);
  });

  it('components never import db/', async () => {
    expect((await messages('components/example.tsx', `import type { Role } from '@/db/types';\nexport type X = Role;\n`)).join()).toMatch(
      /Components never import db/,
    );
  });

  it('lib/ never imports app/', async () => {
    expect((await messages('lib/example.ts', `import { ROUTES } from '@/app/api/_declared/routes';\nexport const x = ROUTES;\n`)).join()).toMatch(
      /lib\/ never imports app/,
    );
  });

  it('app/ and lib/ never import fakes/ or bench/', async () => {
    expect((await messages('app/example.ts', `import { x } from '@/fakes/payments/state';\nexport const y = x;\n`)).join()).toMatch(/fakes/);
    expect((await messages('lib/example.ts', `import { x } from '../bench/run';\nexport const y = x;\n`)).join()).toMatch(/bench/);
  });

  it('process.env is read only in lib/env.ts', async () => {
    expect((await messages('lib/example.ts', `export const x = process.env.STRIPE_SECRET_KEY;\n`)).join()).toMatch(/lib\/env\.ts/);
    expect(await messages('lib/env.ts', `export const x = process.env.STRIPE_SECRET_KEY;\n`)).not.toContainEqual(
      expect.stringMatching(/no-restricted-properties/),
    );
  });
});
