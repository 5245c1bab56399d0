import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { useCreateProject } from '../api/create-project';
import { ProjectForm } from './project-form';
import type { Project } from '../../../../../core/contract/projects';

/** Admins start a project here; the form folds away when not in use. */
export function NewProject({ onCreated }: { onCreated?: (project: Project) => void }) {
  const [open, setOpen] = useState(false);
  const create = useCreateProject();

  if (!open) {
    return (
      <Button onClick={() => setOpen(true)} aria-expanded={false}>
        New project
      </Button>
    );
  }
  return (
    <div className="w-full rounded-sm border border-rule bg-paper px-4 py-3">
      <h3 className="mb-2 text-sm font-semibold">New project</h3>
      <ProjectForm
        label="New project"
        submitLabel="Create project"
        busy={create.isPending}
        error={create.error}
        onSubmit={(fields) =>
          create.mutate(fields, {
            onSuccess: (project) => {
              setOpen(false);
              create.reset();
              onCreated?.(project);
            },
          })
        }
        onCancel={() => {
          setOpen(false);
          create.reset();
        }}
      />
    </div>
  );
}
