import { Button } from '../ui/button';

/**
 * "Previous rows · Page p of n · Next rows" under a paged results table (the mode shapes, the
 * entries of a large matrix); nothing when everything fits one page. `page` is 0-based.
 */
export function PageControls({
  page,
  pages,
  onPage,
  label,
}: {
  page: number;
  pages: number;
  onPage: (page: number) => void;
  /** What the buttons page through, for screen readers ("entries of K"). */
  label: string;
}) {
  if (pages <= 1) return null;
  return (
    <span
      className="flex items-center gap-2 print:hidden"
      role="group"
      aria-label={`Pages of ${label}`}
    >
      <Button
        variant="secondary"
        className="px-2 py-0.5 text-xs"
        disabled={page === 0}
        onClick={() => onPage(page - 1)}
      >
        Previous rows
      </Button>
      <span>
        Page {page + 1} of {pages}
      </span>
      <Button
        variant="secondary"
        className="px-2 py-0.5 text-xs"
        disabled={page === pages - 1}
        onClick={() => onPage(page + 1)}
      >
        Next rows
      </Button>
    </span>
  );
}
