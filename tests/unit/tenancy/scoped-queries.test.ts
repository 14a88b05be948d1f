import { describe, expect, test } from 'vitest';
import { readFileSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import ts from 'typescript';
import { isSpaceTable, SPACE_TABLES } from '@/db/space-tables';

// Every query of the app on a space-owned table goes through scoped() (db/scoped.ts), which writes
// `space_id = ctx.spaceId` into it. This reads lib/, app/ and components/ with TypeScript's parser and
// refuses:
//   - a query builder call naming a space-owned table (selectFrom, updateTable, deleteFrom, insertInto,
//     any join) whose chain does not start at a scoped handle: `scoped(db, ctx).…`, a variable assigned
//     `scoped(…)`, a parameter typed `InSpace`, or a callback parameter of such a chain (a subquery's
//     `eb`, a transaction's `trx`);
//   - raw `sql` text reading or writing a space-owned table without naming space_id.
// A query that must cross spaces (the sign-in guard, the webhook before it knows the space, the sweeps
// over every space) says so in a comment `// across spaces: <why>` on its statement or its function.

const ROOT = path.resolve(__dirname, '../../..');
const DIRS = ['lib', 'app', 'components'];
const TABLE_ARG_METHODS = new Set([
  'selectFrom',
  'updateTable',
  'deleteFrom',
  'insertInto',
  'innerJoin',
  'leftJoin',
  'rightJoin',
  'fullJoin',
  'crossJoin',
  'innerJoinLateral',
  'leftJoinLateral',
  'using',
]);
const MARK = /across spaces:\s*\S/;

function files(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = path.join(dir, name);
    if (statSync(p).isDirectory()) out.push(...files(p));
    else if (/\.tsx?$/.test(name) && !name.endsWith('.d.ts')) out.push(p);
  }
  return out;
}

type Finding = { file: string; line: number; text: string; why: string };

function tableName(arg: ts.Expression | undefined): string | null {
  if (!arg || !(ts.isStringLiteral(arg) || ts.isNoSubstitutionTemplateLiteral(arg))) return null;
  return arg.text.split(/\s+as\s+/)[0].trim();
}

function markedAcross(node: ts.Node, sf: ts.SourceFile): boolean {
  for (let n: ts.Node | undefined = node; n && !ts.isSourceFile(n); n = n.parent) {
    const isHolder =
      ts.isStatement(n) || ts.isFunctionLike(n) || ts.isPropertyAssignment(n) || ts.isVariableDeclaration(n);
    if (!isHolder) continue;
    const ranges = ts.getLeadingCommentRanges(sf.text, n.getFullStart()) ?? [];
    if (ranges.some((r) => MARK.test(sf.text.slice(r.pos, r.end)))) return true;
  }
  return false;
}

const isScopedCall = (e: ts.Expression) =>
  ts.isCallExpression(e) && ts.isIdentifier(e.expression) && e.expression.text === 'scoped';

/** The expression a builder chain starts from: `a` in `a.selectFrom(…).where(…)`. */
function chainRoot(e: ts.Expression): ts.Expression {
  for (;;) {
    if (ts.isCallExpression(e) && !isScopedCall(e)) e = e.expression;
    else if (ts.isPropertyAccessExpression(e)) e = e.expression;
    else if (ts.isParenthesizedExpression(e) || ts.isAwaitExpression(e) || ts.isNonNullExpression(e)) e = e.expression;
    else return e;
  }
}

/** Where `name` is declared, looking outwards from `from`: a variable or a parameter. */
function declarationOf(name: string, from: ts.Node): ts.VariableDeclaration | ts.ParameterDeclaration | null {
  for (let n: ts.Node | undefined = from.parent; n; n = n.parent) {
    if (ts.isFunctionLike(n))
      for (const p of n.parameters) if (ts.isIdentifier(p.name) && p.name.text === name) return p;
    if (ts.isBlock(n) || ts.isSourceFile(n) || ts.isModuleBlock(n) || ts.isCaseClause(n)) {
      for (const s of n.statements)
        if (ts.isVariableStatement(s))
          for (const d of s.declarationList.declarations)
            if (ts.isIdentifier(d.name) && d.name.text === name && d.pos < from.pos) return d;
    }
  }
  return null;
}

/** Whether the chain that ends in `call` starts at a space-scoped handle. */
function startsScoped(root: ts.Expression, depth = 0): boolean {
  if (depth > 8) return false;
  if (isScopedCall(root)) return true;
  if (!ts.isIdentifier(root)) return false;
  const d = declarationOf(root.text, root);
  if (!d) return false;
  if (ts.isVariableDeclaration(d)) {
    if (!d.initializer) return false;
    const init = chainRoot(d.initializer);
    return isScopedCall(init) || (init !== d.initializer && startsScoped(init, depth + 1));
  }
  if (d.type && /\bInSpace\b/.test(d.type.getText())) return true;
  // A callback's parameter (a subquery's `eb`, a transaction's `trx`): scoped when the chain it is
  // passed into is.
  const fn = d.parent;
  if ((ts.isArrowFunction(fn) || ts.isFunctionExpression(fn)) && ts.isCallExpression(fn.parent))
    return startsScoped(chainRoot(fn.parent), depth + 1);
  return false;
}

function scan(file: string): Finding[] {
  const text = readFileSync(file, 'utf8');
  if (!/selectFrom|updateTable|deleteFrom|insertInto|Join\(|sql/.test(text)) return [];
  const kind = file.endsWith('x') ? ts.ScriptKind.TSX : ts.ScriptKind.TS;
  return scanSource(ts.createSourceFile(path.relative(ROOT, file), text, ts.ScriptTarget.Latest, true, kind));
}

describe('every query on a space-owned table is scoped to the caller’s space', () => {
  const all = DIRS.flatMap((d) => files(path.join(ROOT, d)));

  test('the scan reads the services (it is looking at the right files)', () => {
    expect(all.some((f) => f.endsWith(path.join('lib', 'loans', 'return.ts')))).toBe(true);
    expect(SPACE_TABLES).toContain('loan_lines');
  });

  test('no unscoped query in lib/, app/ or components/', () => {
    const findings = all.flatMap(scan);
    expect(findings.map((f) => `${f.file}:${f.line} ${f.why}: ${f.text}`)).toEqual([]);
  }, 60_000);

  test('the scan finds what it should: unscoped calls, raw sql, joins; and accepts scoped ones', () => {
    const probe = 'probe.ts';
    const src = `
      import { scoped, type InSpace } from '@/db/scoped';
      export async function bad(db: Db, ctx: Ctx) {
        await db.selectFrom('loans').selectAll().execute();
        await db.selectFrom('users').innerJoin('memberships as m', 'm.user_id', 'users.id').execute();
        await db.transaction().execute(async (trx) => trx.updateTable('units').set({}).execute());
        await sql\`select 1 from loan_lines where loan_id = \${id}\`.execute(db);
      }
      export async function good(db: Db, ctx: Ctx, inSpace: InSpace) {
        await scoped(db, ctx).selectFrom('loans').select((eb) => eb.selectFrom('holds').select('id').as('h')).execute();
        const q = scoped(db, ctx);
        await q.deleteFrom('holds').execute();
        await scoped(db, ctx).transaction().execute(async (trx) => trx.updateTable('units').set({}).execute());
        await inSpace.insertInto('holds').values({}).execute();
        await sql\`select 1 from loan_lines where space_id = \${s}\`.execute(db);
        await db.selectFrom('users').selectAll().execute();
        // across spaces: a test of the mark
        await db.selectFrom('sales').selectAll().execute();
      }`;
    const f = scanText(probe, src);
    expect(f.map((x) => x.why)).toEqual([
      "selectFrom('loans') not through scoped()",
      "innerJoin('memberships') not through scoped()",
      "updateTable('units') not through scoped()",
      'raw sql on loan_lines without space_id',
    ]);
  });
});

function scanText(file: string, text: string): Finding[] {
  return scanSource(ts.createSourceFile(file, text, ts.ScriptTarget.Latest, true, ts.ScriptKind.TS));
}

function scanSource(sf: ts.SourceFile): Finding[] {
  const found: Finding[] = [];
  const at = (n: ts.Node, why: string) =>
    found.push({
      file: sf.fileName,
      line: sf.getLineAndCharacterOfPosition(n.getStart()).line + 1,
      text: n.getText().split('\n')[0].slice(0, 90),
      why,
    });
  const visit = (n: ts.Node) => {
    if (ts.isCallExpression(n) && ts.isPropertyAccessExpression(n.expression)) {
      const method = n.expression.name.text;
      const table = TABLE_ARG_METHODS.has(method) ? tableName(n.arguments[0]) : null;
      if (table && isSpaceTable(table) && !startsScoped(chainRoot(n.expression.expression)) && !markedAcross(n, sf))
        at(n, `${method}('${table}') not through scoped()`);
    }
    if (ts.isTaggedTemplateExpression(n) && /^sql\b/.test(n.tag.getText())) {
      const body = n.template.getText();
      const names = [...body.matchAll(/\b(?:from|join|update|into)\s+([a-z_]+)/gi)].map((m) => m[1]);
      const hit = names.find((t) => isSpaceTable(t));
      if (hit && !/space_id/.test(body) && !markedAcross(n, sf)) at(n, `raw sql on ${hit} without space_id`);
    }
    ts.forEachChild(n, visit);
  };
  visit(sf);
  return found;
}
