import { requirePageRole } from '@/lib/auth/guard';
import { PageTitle } from '@/components/ui/page-title';
import { ImportWizard } from '@/components/shelf/import-wizard';

export const metadata = { title: 'Import parts' };

export default async function ImportPage() {
  await requirePageRole('steward', 'admin');
  return (
    <div className="max-w-5xl">
      <PageTitle
        title="Import parts and stock"
        lead="Check a CSV file row by row first; the import then adds everything in one go, or nothing at all."
      />
      <ImportWizard />
    </div>
  );
}
