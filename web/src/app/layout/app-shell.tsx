import type { ReactNode } from 'react';
import { Link, NavLink, useNavigate } from 'react-router-dom';
import { Button } from '../../components/ui/button';
import { Alert } from '../../components/ui/alert';
import { paths } from '../../config/paths';
import { useSignOut } from '../../features/auth/api/sign-out';
import { useProjects } from '../../features/projects/api/get-projects';
import { SearchBox } from '../../features/search/components/search-box';
import type { User } from '../../../../core/contract/people';
import { Caution } from './caution';
import { DatabaseBanner } from './database-banner';
import { Wordmark } from './wordmark';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `rounded-sm px-2 py-1 text-sm font-medium ${
    isActive ? 'bg-accent-soft text-accent-strong' : 'text-ink-soft hover:text-ink'
  }`;

export function AppShell({ user, children }: { user: User; children: ReactNode }) {
  const signOut = useSignOut();
  const navigate = useNavigate();
  // The firm's templates are for its engineers: an admin, or an author, checker or principal of
  // some project (not a client's viewer).
  const projects = useProjects();
  const engineer =
    user.isAdmin || (projects.data ?? []).some((p) => p.myRoles.some((r) => r !== 'viewer'));

  return (
    <div className="flex min-h-screen flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:bg-paper-sheet focus:px-3 focus:py-1"
      >
        Skip to content
      </a>
      <header className="border-b border-rule bg-paper-sheet">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-3 px-6 py-3">
          <div className="flex flex-wrap items-center gap-x-6 gap-y-2">
            <Link to={paths.projects.href()} aria-label="Modewright, projects">
              <Wordmark />
            </Link>
            <nav aria-label="Main" className="flex flex-wrap items-center gap-1">
              <NavLink to={paths.projects.href()} end className={navClass}>
                Projects
              </NavLink>
              {engineer ? (
                <NavLink to={paths.templates.href()} className={navClass}>
                  Templates
                </NavLink>
              ) : null}
              {user.isAdmin ? (
                <NavLink to={paths.admin.href()} className={navClass}>
                  Admin
                </NavLink>
              ) : null}
              <NavLink to={paths.outbox.href()} className={navClass}>
                {user.isAdmin ? 'Outbox' : 'Mail'}
              </NavLink>
            </nav>
          </div>
          <SearchBox />
          <div className="flex items-center gap-3">
            <p className="text-sm text-ink-soft">
              Signed in as <span className="font-medium text-ink">{user.name}</span>
            </p>
            <Button
              variant="secondary"
              busy={signOut.isPending}
              onClick={() =>
                signOut.mutate(undefined, {
                  onSuccess: () => navigate(paths.signIn.href(), { replace: true }),
                })
              }
            >
              Sign out
            </Button>
          </div>
        </div>
        {signOut.isError ? (
          <div className="mx-auto max-w-6xl px-6 pb-3">
            <Alert title="Could not sign out.">{signOut.error.message}</Alert>
          </div>
        ) : null}
      </header>
      <DatabaseBanner />
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-6 py-6">
        {children}
      </main>
      <footer className="border-t border-rule bg-paper-sheet">
        <div className="mx-auto max-w-6xl px-6 py-3">
          <Caution />
        </div>
      </footer>
    </div>
  );
}
