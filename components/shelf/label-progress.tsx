/** How far a label run has got, as a real progress bar with its numbers in words. */
export function LabelProgress({ done, total }: { done: number; total: number }) {
  return (
    <div className="w-full max-w-md">
      <progress
        className="h-3 w-full accent-accent"
        max={Math.max(total, 1)}
        value={done}
        aria-label="Labels laid out"
      />
      <p className="muted text-xs">
        {done} of {total} labels laid out
      </p>
    </div>
  );
}
