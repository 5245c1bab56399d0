import { useEffect } from 'react';
import { useNavigate } from 'react-router-dom';
import { Section } from '../../components/ui/section';
import { paths } from '../../config/paths';
import { ProjectsTable } from '../../features/projects/components/projects-table';
import { NewProject } from '../../features/projects/components/new-project';
import { useSignedInUser } from './use-user';

export function ProjectsRoute() {
  const user = useSignedInUser();
  const navigate = useNavigate();

  useEffect(() => {
    document.title = 'Projects · Modewright';
  }, []);

  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-2xl font-semibold">Projects</h1>
        <p className="text-sm text-ink-soft">
          {user.isAdmin
            ? 'Every project in this installation.'
            : 'The projects you are a member of.'}
        </p>
      </div>
      {user.isAdmin ? (
        <NewProject onCreated={(project) => navigate(paths.project.href(project.id))} />
      ) : null}
      <Section title={user.isAdmin ? 'All projects' : 'My projects'}>
        <ProjectsTable isAdmin={user.isAdmin} />
      </Section>
    </div>
  );
}
