import { Link } from 'react-router-dom';
import { Table, Td, Th } from '../../../components/ui/table';
import { Spinner } from '../../../components/ui/spinner';
import { QueryError } from '../../../components/ui/alert';
import { EmptyState } from '../../../components/ui/empty-state';
import { FilterBar } from '../../../components/ui/filter-bar';
import { Badge } from '../../../components/ui/badge';
import { paths } from '../../../config/paths';
import { roleLabel } from '../../../config/words';
import { useState } from 'react';
import { useProjects } from '../api/get-projects';

export function ProjectsTable({ isAdmin }: { isAdmin: boolean }) {
  const projects = useProjects();
  const [filter, setFilter] = useState('');

  if (projects.isPending) return <Spinner label="Loading projects…" />;
  if (projects.isError) {
    return (
      <QueryError what="the projects" error={projects.error} onRetry={() => projects.refetch()} />
    );
  }
  if (projects.data.length === 0) {
    return (
      <EmptyState title="No projects yet">
        {isAdmin
          ? 'Start one with “New project”.'
          : 'You are not a member of any project. An administrator can add you to one.'}
      </EmptyState>
    );
  }

  const needle = filter.trim().toLowerCase();
  const shown = needle
    ? projects.data.filter((p) =>
        [p.jobNumber, p.name, p.client, p.site].some((v) => v.toLowerCase().includes(needle)),
      )
    : projects.data;

  return (
    <>
      <FilterBar
        label="Filter projects"
        placeholder="Job no., name, client or site"
        value={filter}
        onChange={setFilter}
        shown={shown.length}
        total={projects.data.length}
        countWords={plural}
        widthClass="w-80"
      />
      {shown.length === 0 ? (
        <EmptyState title="No project matches the filter" />
      ) : (
        <Table caption="Projects">
          <thead>
            <tr>
              <Th>Job no.</Th>
              <Th>Name</Th>
              <Th>Client</Th>
              <Th>Site</Th>
              <Th>My roles</Th>
            </tr>
          </thead>
          <tbody>
            {shown.map((project) => (
              <tr key={project.id} className="hover:bg-paper-deep/50">
                <Td className="font-mono whitespace-nowrap">{project.jobNumber}</Td>
                <Td>
                  <Link
                    to={paths.project.href(project.id)}
                    className="font-medium text-accent-strong underline-offset-2 hover:underline"
                  >
                    {project.name}
                  </Link>
                </Td>
                <Td>{project.client}</Td>
                <Td>{project.site}</Td>
                <Td>
                  {project.myRoles.length > 0 ? (
                    <span className="flex flex-wrap gap-1">
                      {project.myRoles.map((role) => (
                        <Badge key={role}>{roleLabel(role)}</Badge>
                      ))}
                    </span>
                  ) : (
                    <span className="text-ink-faint">
                      {isAdmin ? 'none (admin access)' : 'none'}
                    </span>
                  )}
                </Td>
              </tr>
            ))}
          </tbody>
        </Table>
      )}
    </>
  );
}

const plural = (n: number) => `${n} project${n === 1 ? '' : 's'}`;
