import { lazy, Suspense } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { Spinner } from '../../components/ui/spinner';
import { Section } from '../../components/ui/section';
import { paths } from '../../config/paths';
import { useSheet } from '../../features/editor/api/get-sheet';
import { useDraftRemarkMarks } from '../../features/review/api/pending-remarks';
import { SaveTemplate } from '../../features/sheets/components/save-template';
import { useGoToPlace } from '../../lib/use-go-to-place';
import { useSignedInUser } from './use-user';
import {
  IssueForCheck,
  RevisionList,
  SheetHistory,
} from '../../features/review/components/sheet-review-panel';

// The editor brings CodeMirror, KaTeX, the charts and Markdown: loaded only when a sheet opens.
const SheetEditor = lazy(() =>
  import('../../features/editor/components/sheet-editor').then((m) => ({ default: m.SheetEditor })),
);

/** The sheet editor on the draft. */
export function SheetRoute() {
  const { sheetId: raw } = useParams();
  const sheetId = Number(raw);
  const valid = Number.isInteger(sheetId) && sheetId > 0;
  const remarks = useDraftRemarkMarks(valid ? sheetId : 0);
  const user = useSignedInUser();
  // The editor's own query (cached): whether this person may save the draft as a firm template.
  const sheet = useSheet(valid ? sheetId : 0);
  // `?block=…&line=…` (a search result, a shared link): the editor opens on that line.
  useGoToPlace('editor');
  if (!valid) {
    return (
      <Alert title="No such sheet.">
        “{raw}” is not a sheet number. <Link to={paths.projects.href()}>Back to projects</Link>
      </Alert>
    );
  }
  return (
    <div className="flex flex-col gap-4">
      <IssueForCheck sheetId={sheetId} revisionHref={paths.revision.href} />
      <Suspense fallback={<Spinner label="Opening the editor…" />}>
        <SheetEditor
          sheetId={sheetId}
          projectHref={(id) => paths.project.href(id)}
          {...(remarks ? { remarks } : {})}
        />
      </Suspense>
      {sheet.data && (sheet.data.sheet.myRoles.includes('author') || user.isAdmin) ? (
        <SaveTemplate sheetId={sheetId} sheetNumber={sheet.data.sheet.number} />
      ) : null}
      <Section title="Revisions">
        {/* a wide table scrolls in its own box on a phone, not the page */}
        <div className="overflow-x-auto">
          <RevisionList sheetId={sheetId} revisionHref={paths.revision.href} />
        </div>
      </Section>
      <Section title="History">
        <SheetHistory sheetId={sheetId} />
      </Section>
    </div>
  );
}
