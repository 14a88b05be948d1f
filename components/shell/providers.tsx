'use client';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { useState } from 'react';
import { z } from 'zod';

// zod compiles object parsers with `new Function` when it may; the pages' Content-Security-Policy does not
// allow eval, so in the browser zod runs without that (and the attempt does not raise a CSP report).
z.config({ jitless: true });

// One TanStack Query client per browser tab for client-side data fetching.
export function Providers({ children }: { children: React.ReactNode }) {
  const [client] = useState(
    () => new QueryClient({ defaultOptions: { queries: { staleTime: 15_000, retry: 1 } } }),
  );
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}
