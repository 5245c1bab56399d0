import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { Button } from '../../components/ui/button';
import { paths } from '../../config/paths';

/** What went wrong, in words a person can pass on: the error's own message when it has one. */
function describe(error: unknown): string {
  if (isRouteErrorResponse(error)) return `${error.status} ${error.statusText}`.trim();
  if (error instanceof Error && error.message) return error.message;
  return String(error);
}

/**
 * The error boundary of one route: a screen that fails to render (or whose code fails to load)
 * shows this in its place, inside the app's shell, instead of blanking the page. The other
 * screens keep working.
 */
export function RouteError({ screen }: { screen: string }) {
  const error = useRouteError();
  const chunkFailed =
    error instanceof Error && /dynamically imported module|Importing a module/i.test(error.message);
  return (
    <div className="mx-auto flex max-w-2xl flex-col gap-3 px-4 py-8">
      <h1 className="text-2xl font-semibold">The {screen} could not be shown</h1>
      <Alert title="What went wrong">{describe(error)}</Alert>
      <p className="text-sm text-ink-soft">
        {chunkFailed
          ? 'The app was probably updated on the server while this page was open: reload to fetch the new version.'
          : 'What is saved on the server is kept. Reload to try again; if it happens again, tell your administrator what you did and the message above.'}
      </p>
      <div className="flex flex-wrap items-center gap-3">
        <Button onClick={() => window.location.reload()}>Reload</Button>
        <Link to={paths.projects.href()} className="text-sm text-accent-strong hover:underline">
          Go to projects
        </Link>
      </div>
    </div>
  );
}
