import { Link } from 'react-router-dom';
import { paths } from '../../config/paths';

export function NotFoundRoute() {
  return (
    <div className="flex flex-col gap-2">
      <h1 className="text-2xl font-semibold">Page not found</h1>
      <p className="text-sm text-ink-soft">There is nothing at this address.</p>
      <Link to={paths.projects.href()} className="text-sm text-accent-strong hover:underline">
        Go to projects
      </Link>
    </div>
  );
}
