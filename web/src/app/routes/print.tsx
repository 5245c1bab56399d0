import { Navigate, useLocation, useParams } from 'react-router-dom';
import { Alert, QueryError } from '../../components/ui/alert';
import { Spinner } from '../../components/ui/spinner';
import { paths } from '../../config/paths';
import { useMe } from '../../features/auth/api/get-me';
import { PrintView } from '../../features/print/components/print-view';
import type { PrintRemarks } from '../../features/print/components/remarks-record';
import { useRemarks } from '../../features/review/api/get-remarks';

/**
 * The calculation package, without the app's header and navigation so the page prints as paper;
 * it still needs a signed-in member, like the revision itself.
 */
export function PrintRoute() {
  const me = useMe();
  const location = useLocation();
  const { revisionId: raw } = useParams();
  const revisionId = Number(raw);
  const valid = Number.isInteger(revisionId) && revisionId > 0;
  // The record of the check comes from the revision's remarks, printed after the sheet.
  const remarksQuery = useRemarks(revisionId, valid && Boolean(me.data));
  const remarks: PrintRemarks = remarksQuery.isSuccess
    ? { status: 'ready', remarks: remarksQuery.data }
    : remarksQuery.isError
      ? { status: 'error', message: remarksQuery.error.message }
      : { status: 'loading' };

  if (me.isPending) return <Spinner label="Opening the package…" />;
  if (me.isError) return <QueryError what="your session" error={me.error} />;
  if (!me.data) return <Navigate to={paths.signIn.href(location.pathname)} replace />;
  if (!valid) {
    return <Alert title="No such revision.">“{raw}” is not a revision number.</Alert>;
  }
  return (
    <main id="main" className="bg-paper-deep py-6 print:bg-white print:py-0">
      <PrintView
        revisionId={revisionId}
        backHref={`/revisions/${revisionId}`}
        verifyUrl={(path) => `${window.location.origin}${path}`}
        remarks={remarks}
      />
    </main>
  );
}
