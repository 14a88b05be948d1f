import { requirePageUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { ShelfNav } from '@/components/shelf/shelf-nav';

export default async function ShelfLayout({ children }: { children: React.ReactNode }) {
  const ctx = await requirePageUser();
  return (
    <>
      <ShelfNav staff={isStaff(ctx)} />
      {children}
    </>
  );
}
