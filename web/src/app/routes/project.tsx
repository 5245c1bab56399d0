import { Link, useParams } from 'react-router-dom';
import { Section } from '../../components/ui/section';
import { Alert } from '../../components/ui/alert';
import { paths } from '../../config/paths';
import { ProjectHeader } from '../../features/projects/components/project-header';
import { MembersTable } from '../../features/members/components/members-table';
import { AddMemberForm } from '../../features/members/components/add-member-form';
import { ActivityList } from '../../features/activity/components/activity-list';
import { useProject } from '../../features/projects/api/get-project';
import { SheetsTable } from '../../features/sheets/components/sheets-table';
import { useSignedInUser } from './use-user';

export function ProjectRoute() {
  const user = useSignedInUser();
  const { projectId: raw } = useParams();
  const projectId = Number(raw);

  if (!Number.isInteger(projectId) || projectId <= 0) {
    return (
      <Alert title="No such project.">
        “{raw}” is not a project number. <Link to={paths.projects.href()}>Back to projects</Link>
      </Alert>
    );
  }

  return (
    <div className="flex flex-col gap-6">
      <nav aria-label="Breadcrumb" className="text-sm">
        <Link to={paths.projects.href()} className="text-accent-strong hover:underline">
          ← Projects
        </Link>
      </nav>
      <ProjectHeader projectId={projectId} canEdit={user.isAdmin} />
      <ProjectSheets projectId={projectId} />
      <Section title="Members">
        <MembersTable projectId={projectId} canManage={user.isAdmin} />
        {user.isAdmin ? <AddMemberForm projectId={projectId} /> : null}
      </Section>
      <Section title="Activity">
        <ActivityList projectId={projectId} />
      </Section>
    </div>
  );
}

/** The project's sheets; authors (and only they) start new ones. */
function ProjectSheets({ projectId }: { projectId: number }) {
  const project = useProject(projectId);
  const canCreate = project.data?.myRoles.includes('author') ?? false;
  return (
    <Section
      title="Sheets"
      actions={
        <Link
          to={paths.package.href(projectId)}
          className="text-sm font-medium text-accent-strong hover:underline"
        >
          Calculation package
        </Link>
      }
    >
      <SheetsTable projectId={projectId} canCreate={canCreate} sheetHref={paths.sheet.href} />
    </Section>
  );
}
