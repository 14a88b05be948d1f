import { requirePageUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { ShelfNav } from '@/components/shelf/shelf-nav';
import { QueryProvider } from '@/components/shell/query-provider';

// The shelf's client leaves use TanStack Query (components/shell/query-provider.tsx).
export default async function ShelfLayout({ children }: { children: React.ReactNode }) {
  const ctx = await requirePageUser();
  return (
    <QueryProvider>
      <ShelfNav staff={isStaff(ctx)} />
      {children}
    </QueryProvider>
  );
}
