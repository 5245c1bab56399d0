import { useEffect } from 'react';
import { Link, Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { Spinner } from '../../components/ui/spinner';
import { paths, safeRedirect } from '../../config/paths';
import { useMe } from '../../features/auth/api/get-me';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { Caution } from '../layout/caution';
import { Wordmark } from '../layout/wordmark';

export function SignInRoute() {
  const me = useMe();
  const navigate = useNavigate();
  const [search] = useSearchParams();
  const redirectTo = safeRedirect(search.get('redirectTo'));

  useEffect(() => {
    document.title = 'Sign in · Modewright';
  }, []);

  if (me.data) return <Navigate to={redirectTo} replace />;

  return (
    <div className="flex min-h-screen flex-col">
      <main className="flex flex-1 items-center justify-center px-6 py-12">
        <div className="w-full max-w-sm">
          <div className="mb-6">
            <Wordmark large />
            <p className="mt-2 text-sm text-ink-soft">
              Calculation sheets for structural dynamics: prepared, checked and sealed.
            </p>
          </div>
          <div className="rounded-sm border border-rule bg-paper-sheet px-6 py-5 shadow-sheet">
            <h1 className="mb-4 text-lg font-semibold">Sign in</h1>
            {me.isPending ? (
              <Spinner label="Checking your session…" />
            ) : (
              <SignInForm onSignedIn={() => navigate(redirectTo, { replace: true })} />
            )}
          </div>
          <p className="mt-4 text-sm text-ink-soft">
            Holding a sealed sheet?{' '}
            <Link to={paths.verify.href()} className="text-accent-strong hover:underline">
              Verify its seal
            </Link>{' '}
            — no sign-in needed.
          </p>
        </div>
      </main>
      <footer className="border-t border-rule px-6 py-3">
        <div className="mx-auto max-w-6xl">
          <Caution />
        </div>
      </footer>
    </div>
  );
}
