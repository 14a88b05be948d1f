import { afterEach, expect, test, vi } from 'vitest';

// The browser's zod must not compile parsers (the pages' CSP refuses eval). The flag is set on zod's global
// config object without importing zod, so pages that never parse do not download it; this holds zod to
// reading that object (zod/v4/core keeps it on globalThis.__zod_globalConfig).
type ZodGlobal = { __zod_globalConfig?: { jitless?: boolean } };

afterEach(() => {
  vi.unstubAllGlobals();
  vi.resetModules();
});

test('in a browser, the flag set without importing zod is the one zod reads', async () => {
  vi.stubGlobal('window', {});
  await import('@/components/shell/zod-jitless');
  const { z } = await import('zod');
  expect(z.config().jitless).toBe(true);
  // And an object schema built afterwards parses (without compiling) as it should.
  expect(z.object({ code: z.string() }).safeParse({ code: 7 }).success).toBe(false);
  delete (globalThis as ZodGlobal).__zod_globalConfig?.jitless;
});

test('on the server the flag is left alone (request validation keeps compiled parsers)', async () => {
  const g = globalThis as ZodGlobal;
  delete g.__zod_globalConfig?.jitless;
  await import('@/components/shell/zod-jitless');
  const { z } = await import('zod');
  expect(z.config().jitless).toBeUndefined();
});
