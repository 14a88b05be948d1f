import { isLoopbackUrl } from '@/lib/setup/address';

// Server component: how this installation is reached and which version runs. Warns when the public
// address is a loopback one, since every printed label and e-mailed link would then point at nothing
// a member's phone can open.
export function DeploymentNotes({ baseUrl, version }: { baseUrl: string; version: string }) {
  const loopback = isLoopbackUrl(baseUrl);
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
    </section>
  );
}
