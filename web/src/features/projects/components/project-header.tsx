import { useEffect, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { QueryError } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { roleLabel } from '../../../config/words';
import { useProject } from '../api/get-project';
import { useUpdateProject } from '../api/update-project';
import { ProjectForm } from './project-form';

/** The title block of a project: job no., name, client, site; admins may correct them. */
export function ProjectHeader({ projectId, canEdit }: { projectId: number; canEdit: boolean }) {
  const project = useProject(projectId);
  const update = useUpdateProject(projectId);
  const [editing, setEditing] = useState(false);
  const title = project.data ? `${project.data.jobNumber} ${project.data.name}` : null;

  useEffect(() => {
    if (title) document.title = `${title} · Modewright`;
  }, [title]);

  if (project.isPending) return <Spinner label="Loading the project…" />;
  if (project.isError) {
    return (
      <QueryError what="this project" error={project.error} onRetry={() => project.refetch()} />
    );
  }
  const p = project.data;

  if (editing) {
    return (
      <div className="rounded-sm border border-rule bg-paper-sheet px-5 py-4 shadow-sheet">
        <h1 className="mb-3 text-lg font-semibold">Edit project details</h1>
        <ProjectForm
          label="Edit project details"
          submitLabel="Save details"
          initial={{ jobNumber: p.jobNumber, name: p.name, client: p.client, site: p.site }}
          busy={update.isPending}
          error={update.error}
          onSubmit={(fields) =>
            update.mutate(fields, {
              onSuccess: () => {
                setEditing(false);
                update.reset();
              },
            })
          }
          onCancel={() => {
            setEditing(false);
            update.reset();
          }}
        />
      </div>
    );
  }

  return (
    <header className="rounded-sm border border-rule bg-paper-sheet shadow-sheet">
      <div className="flex flex-wrap items-start justify-between gap-3 border-b border-rule px-5 py-4">
        <div>
          <p className="text-xs tracking-wide text-ink-faint uppercase">
            Job no. <span className="font-mono text-sm text-ink normal-case">{p.jobNumber}</span>
          </p>
          <h1 className="mt-1 text-2xl font-semibold text-ink">{p.name}</h1>
        </div>
        {canEdit ? (
          <Button variant="secondary" onClick={() => setEditing(true)}>
            Edit details
          </Button>
        ) : null}
      </div>
      <dl className="grid gap-x-8 gap-y-2 px-5 py-3 text-sm sm:grid-cols-3">
        <div>
          <dt className="text-xs tracking-wide text-ink-faint uppercase">Client</dt>
          <dd>{p.client}</dd>
        </div>
        <div>
          <dt className="text-xs tracking-wide text-ink-faint uppercase">Site</dt>
          <dd>{p.site}</dd>
        </div>
        <div>
          <dt className="text-xs tracking-wide text-ink-faint uppercase">My roles</dt>
          <dd className="flex flex-wrap gap-1">
            {p.myRoles.length > 0 ? (
              p.myRoles.map((role) => <Badge key={role}>{roleLabel(role)}</Badge>)
            ) : (
              <span className="text-ink-faint">none</span>
            )}
          </dd>
        </div>
      </dl>
    </header>
  );
}
