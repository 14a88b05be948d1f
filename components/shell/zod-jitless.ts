// zod keeps its settings on globalThis.__zod_globalConfig (zod/v4/core makes the object on its first import
// when it is absent, and reads `jitless` when an object schema is built). The pages' Content-Security-Policy
// does not allow eval, so in the browser zod must run without compiling parsers (`new Function`), or the
// attempt raises a CSP report. Setting the flag there, before any schema module runs, does that without
// downloading zod on pages that never parse anything in the browser (the scan page, the label pages).
// Only in the browser: on the server the same process validates every request, where compiled parsers pay.
type ZodGlobal = { __zod_globalConfig?: { jitless?: boolean } };

if (typeof window !== 'undefined') {
  const g = globalThis as ZodGlobal;
  (g.__zod_globalConfig ??= {}).jitless = true;
}

export {};
