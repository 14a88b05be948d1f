import type { LastBackup } from '@/lib/backup/run';
import { isLoopbackUrl } from '@/lib/setup/address';

// Server component: how this installation is reached, which version runs, the last backups, and the
// space's data as one download. Warns when the public address is a loopback one (every printed label and
// e-mailed link would point at nothing a member's phone can open) and when the last backup failed.

const when = (d: Date) => `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
function size(bytes: number | null): string {
  if (bytes === null) return '';
  if (bytes < 1024 * 1024) return `${Math.max(1, Math.round(bytes / 1024))} KB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

export function DeploymentNotes({
  baseUrl,
  version,
  backups,
}: {
  baseUrl: string;
  version: string;
  backups: { last: LastBackup; lastGood: LastBackup };
}) {
  const loopback = isLoopbackUrl(baseUrl);
  const { last, lastGood } = backups;
  return (
    <section aria-labelledby="deployment-title" className="card mt-6 space-y-2">
      <h2 id="deployment-title" className="text-lg font-semibold">
        This installation
      </h2>
      <p className="text-sm">
        Public address: <strong className="break-all">{baseUrl}</strong> · version <strong>{version}</strong>
      </p>
      {loopback ? (
        <p role="alert" className="rounded-md border border-amber-700 bg-amber-50 p-2 text-sm text-amber-950 dark:bg-amber-950 dark:text-amber-100">
          The public address is a loopback address: labels, sign-in links and receipts point at this machine only,
          so phones cannot open them. Set APP_BASE_URL to the address members reach (the TLS front&apos;s name) and
          restart before printing labels.
        </p>
      ) : null}
      <p className="text-sm" data-testid="last-backup">
        {lastGood ? (
          <>
            Last good backup: <strong>{when(lastGood.takenAt)}</strong>, {size(lastGood.sizeBytes)}.
          </>
        ) : (
          <>No nightly backup yet.</>
        )}
      </p>
      {last && !last.ok ? (
        <p role="alert" className="rounded-md border border-red-700 bg-red-50 p-2 text-sm text-red-900 dark:bg-red-950 dark:text-red-100">
          The backup of {when(last.takenAt)} failed: {last.error}
        </p>
      ) : null}
      <p className="text-sm">
        <a className="btn-quiet inline-block" href="/api/export" download>
          Download everything (zip of CSV files)
        </a>
      </p>
    </section>
  );
}
