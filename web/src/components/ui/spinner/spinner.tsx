/** A loading state with words, so it is announced and readable. */
export function Spinner({ label = 'Loading…' }: { label?: string }) {
  return (
    <div role="status" className="flex items-center gap-2 py-4 text-sm text-ink-soft">
      <span
        aria-hidden="true"
        className="size-4 animate-spin rounded-full border-2 border-accent border-t-transparent"
      />
      <span>{label}</span>
    </div>
  );
}
