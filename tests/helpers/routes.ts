import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';

// Every route handler in app/api, found on disk, so a new route cannot slip past the matrix and the fuzzer.
// `door` says which builds hold the file (next.config.mjs): 'app' every build, 'test' the test build
// (route.testhooks.ts), 'bench' the bench build only (route.benchonly.ts).
export type Door = 'app' | 'test' | 'bench';
export type RouteFile = { pattern: string; methods: string[]; file: string; door: Door };
const DOOR_OF: Record<string, Door> = { 'route.ts': 'app', 'route.testhooks.ts': 'test', 'route.benchonly.ts': 'bench' };

const ROOT = path.resolve(__dirname, '../../app/api');
const METHOD_RE = /export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b|export\s*\{([^}]*)\}/g;

/** The OpenAPI form of a pattern: /api/loans/[id] → /api/loans/{id}. */
export const openApiPath = (pattern: string) => pattern.replace(/\[(?:\.\.\.)?(\w+)\]/g, '{$1}');

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    return statSync(full).isDirectory() ? walk(full) : name in DOOR_OF ? [full] : [];
  });
}

export function apiRoutes(): RouteFile[] {
  return walk(ROOT)
    .map((file) => {
      const src = readFileSync(file, 'utf8');
      const methods = new Set<string>();
      for (const m of src.matchAll(METHOD_RE)) {
        if (m[1]) methods.add(m[1]);
        if (m[2]) for (const part of m[2].split(',')) {
          const as = part.trim().split(/\s+as\s+/).pop()?.trim();
          if (as && /^(GET|POST|PUT|PATCH|DELETE)$/.test(as)) methods.add(as);
        }
      }
      const rel = path.relative(ROOT, path.dirname(file)).split(path.sep).join('/');
      const door = DOOR_OF[path.basename(file)];
      return { pattern: `/api${rel ? `/${rel}` : ''}`, methods: [...methods].sort(), file, door };
    })
    .sort((a, b) => a.pattern.localeCompare(b.pattern));
}

/** A concrete path for a pattern: dynamic segments get the values given, else harmless unknowns. */
export function concrete(pattern: string, values: Record<string, string> = {}): string {
  return pattern.replace(/\[(?:\.\.\.)?(\w+)\]/g, (_, name: string) =>
    values[name] ?? (name === 'id' ? '00000000-0000-4000-8000-000000000000' : name === 'code' ? '0000000' : 'unknown'),
  );
}
