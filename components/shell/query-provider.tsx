'use client';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { useState } from 'react';

// One TanStack Query client per section for the client leaves that fetch or send through it (tables, forms,
// the counter). It wraps only the sections that have such leaves (their layout.tsx), not the root layout, so
// the pages without any (Today, Scan, Bench check, Settings, sign-in) do not download it.
// A section's layout stays mounted while one moves inside it, and so does its cache.
export function QueryProvider({ children }: { children: React.ReactNode }) {
  const [client] = useState(
    () => new QueryClient({ defaultOptions: { queries: { staleTime: 15_000, retry: 1 } } }),
  );
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}
