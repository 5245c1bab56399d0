import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { Spinner } from '../../components/ui/spinner';
import { QueryError } from '../../components/ui/alert';
import { paths } from '../../config/paths';
import { useMe } from '../../features/auth/api/get-me';
import { AppShell } from '../layout/app-shell';

/** Every signed-in page: sends strangers to sign in, and back here afterwards. */
export function ProtectedLayout() {
  const me = useMe();
  const location = useLocation();

  if (me.isPending) {
    return (
      <div className="mx-auto max-w-md px-6 py-16">
        <Spinner label="Opening Modewright…" />
      </div>
    );
  }
  if (me.isError) {
    return (
      <div className="mx-auto max-w-md px-6 py-16">
        <QueryError what="your session" error={me.error} onRetry={() => me.refetch()} />
      </div>
    );
  }
  if (!me.data) {
    return (
      <Navigate
        to={paths.signIn.href(`${location.pathname}${location.search}${location.hash}`)}
        replace
      />
    );
  }
  return (
    <AppShell user={me.data}>
      <Outlet context={me.data} />
    </AppShell>
  );
}
