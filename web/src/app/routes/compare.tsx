import { Link, useParams, useSearchParams } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { paths } from '../../config/paths';
import { CompareView } from '../../features/compare/components/compare-view';
import { useSheetReview } from '../../features/review/api/get-sheet-review';

const positive = (raw: string | null) => {
  const n = Number(raw);
  return Number.isInteger(n) && n > 0 ? n : null;
};

/** Compare two revisions, or a revision and the draft. */
export function CompareRoute() {
  const { sheetId: raw } = useParams();
  const [search, setSearch] = useSearchParams();
  const sheetId = Number(raw);
  const valid = Number.isInteger(sheetId) && sheetId > 0;
  const sheet = useSheetReview(valid ? sheetId : 0, valid);
  if (!valid) {
    return (
      <Alert title="No such sheet.">
        “{raw}” is not a sheet number. <Link to={paths.projects.href()}>Back to projects</Link>
      </Alert>
    );
  }
  const from = positive(search.get('from'));
  const toRaw = search.get('to');
  const to = toRaw === 'draft' ? 'draft' : positive(toRaw);
  return (
    <div className="flex flex-col gap-4">
      {sheet.data ? (
        <Link
          to={paths.sheet.href(sheet.data.projectId, sheet.data.id)}
          className="self-start text-sm text-accent-strong hover:underline"
        >
          ← Sheet {sheet.data.number}
        </Link>
      ) : null}
      <h1 className="text-xl font-semibold text-ink">
        Compare{sheet.data ? ` — ${sheet.data.number} ${sheet.data.title}` : ''}
      </h1>
      <CompareView
        sheetId={sheetId}
        from={from}
        to={to}
        onChange={(f, t) => setSearch({ from: String(f), to: String(t) })}
        revisionHref={paths.revision.href}
      />
    </div>
  );
}
