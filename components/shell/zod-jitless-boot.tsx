'use client';
import './zod-jitless';

/**
 * Rendered once by the root layout, so the browser sets zod's `jitless` flag (zod-jitless.ts) on every page
 * before any form's schema module runs. It draws nothing and imports nothing else.
 */
export function ZodJitless() {
  return null;
}
