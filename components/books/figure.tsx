/** One figure of the Books (a label above an amount), a tile of a `<dl>` grid. */
export function Figure({ label, value, testId, minor }: { label: string; value: string; testId?: string; minor?: number }) {
  return (
    <div className="rounded-lg border border-stone-200 p-2 dark:border-stone-700">
      <dt className="muted text-xs">{label}</dt>
      <dd className="text-lg font-bold tabular-nums" data-testid={testId} data-minor={minor}>
        {value}
      </dd>
    </div>
  );
}
