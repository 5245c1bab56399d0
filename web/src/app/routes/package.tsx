import { useEffect } from 'react';
import { Navigate, useLocation, useParams, useSearchParams } from 'react-router-dom';
import { Alert, QueryError } from '../../components/ui/alert';
import { Spinner } from '../../components/ui/spinner';
import { paths } from '../../config/paths';
import { useMe } from '../../features/auth/api/get-me';
import { PackageView } from '../../features/print/components/package-view';

/** `?revisions=4,9` as ids; absent or empty means the default choice. */
function chosenFrom(raw: string | null): number[] | null {
  if (raw === null) return null;
  const ids = raw
    .split(',')
    .filter((s) => /^\d+$/.test(s))
    .map(Number);
  return ids;
}

/**
 * Where verify addresses point: the server's PDF printer loads this page at its own address and
 * names the address the person used as `mwVerifyBase`; a browser uses its own.
 */
function verifyBase(): string {
  const given = (window as { mwVerifyBase?: unknown }).mwVerifyBase;
  return typeof given === 'string' ? given : window.location.origin;
}

/** A project's calculation package, printed as paper like a single revision's print. */
export function PackageRoute() {
  const me = useMe();
  const location = useLocation();
  const { projectId: raw } = useParams();
  const [params, setParams] = useSearchParams();
  const projectId = Number(raw);
  const revisions = chosenFrom(params.get('revisions'));

  useEffect(() => {
    document.title = 'Calculation package · Modewright';
  }, []);

  if (me.isPending) return <Spinner label="Opening the package…" />;
  if (me.isError) return <QueryError what="your session" error={me.error} />;
  if (!me.data) {
    return <Navigate to={paths.signIn.href(location.pathname + location.search)} replace />;
  }
  if (!Number.isInteger(projectId) || projectId <= 0) {
    return <Alert title="No such project.">“{raw}” is not a project number.</Alert>;
  }
  return (
    <main id="main" className="bg-paper-deep py-6 print:bg-white print:py-0">
      <PackageView
        projectId={projectId}
        revisions={revisions && revisions.length > 0 ? revisions : null}
        onChoose={(ids) => setParams({ revisions: ids.join(',') }, { replace: true })}
        backHref={paths.project.href(projectId)}
        verifyUrl={(path) => `${verifyBase()}${path}`}
      />
    </main>
  );
}
