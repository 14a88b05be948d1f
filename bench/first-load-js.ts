// First-load JavaScript of a page in a production build, gzipped: the chunks the browser fetches
// before the page can run — Next.js's root main files plus every chunk of the page's own entry points
// (its layouts, error and not-found boundaries and the page), as the build's manifests list them.
// Chunks imported later (import() on demand, such as the camera decoder) are not in these lists.
// Polyfill files are left out: they load only in browsers without ES modules (nomodule).
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import vm from 'node:vm';
import { gzipSync } from 'node:zlib';

export type JsSize = { files: number; rawBytes: number; gzipBytes: number; source: string };

function sizeOf(dist: string, files: Iterable<string>, source: string): JsSize {
  let rawBytes = 0;
  let gzipBytes = 0;
  let n = 0;
  for (const f of files) {
    const buf = readFileSync(path.join(dist, f));
    rawBytes += buf.length;
    gzipBytes += gzipSync(buf).length;
    n++;
  }
  return { files: n, rawBytes, gzipBytes, source };
}

/** `route` as the app directory names it, e.g. '/(app)/scan/page'. Null when the build has no such page. */
export function firstLoadFromManifests(dist: string, route: string): JsSize | null {
  const manifestFile = path.join(dist, 'server/app', `${route}_client-reference-manifest.js`);
  if (!existsSync(manifestFile)) return null;
  const sandbox: { globalThis?: unknown; __RSC_MANIFEST?: Record<string, { entryJSFiles?: Record<string, string[]> }> } = {};
  sandbox.globalThis = sandbox;
  vm.runInNewContext(readFileSync(manifestFile, 'utf8'), sandbox);
  const entry = sandbox.__RSC_MANIFEST?.[route]?.entryJSFiles ?? {};
  const build = JSON.parse(readFileSync(path.join(dist, 'build-manifest.json'), 'utf8')) as { rootMainFiles?: string[] };
  const files = new Set<string>([...(build.rootMainFiles ?? []), ...Object.values(entry).flat()]);
  return sizeOf(dist, files, 'build manifests');
}

/**
 * The framework's own share: Next.js's root main files (React, the router, the runtime), which every page of
 * any app built with this Next.js loads first. The floor under every page's figure.
 */
export function frameworkFloor(dist: string): JsSize {
  const build = JSON.parse(readFileSync(path.join(dist, 'build-manifest.json'), 'utf8')) as { rootMainFiles?: string[] };
  return sizeOf(dist, build.rootMainFiles ?? [], 'framework floor (root main files)');
}

/** The same figure from the page as served: every /_next/static/…js script the HTML names. */
export function firstLoadFromHtml(dist: string, html: string): JsSize {
  const files = new Set<string>();
  for (const m of html.matchAll(/<script[^>]*\ssrc="\/_next\/(static\/[^"?]+\.js)[^"]*"[^>]*>/g)) {
    if (!/\snoModule|\snomodule/.test(m[0])) files.add(m[1]);
  }
  return sizeOf(dist, files, 'served HTML');
}
