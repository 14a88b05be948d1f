import { QueryProvider } from '@/components/shell/query-provider';

// This section's client leaves use TanStack Query (components/shell/query-provider.tsx).
export default function LoansLayout({ children }: { children: React.ReactNode }) {
  return <QueryProvider>{children}</QueryProvider>;
}
