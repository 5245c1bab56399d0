// Projects and their members (/api/projects, /api/projects/:id/members).
import { z } from 'zod';
import { id, isoTime, projectRole } from './common';

export { projectRole };

export const project = z.strictObject({
  id,
  jobNumber: z.string(),
  name: z.string(),
  client: z.string(),
  site: z.string(),
  /** The roles the asking person holds in this project (empty for an admin who is not a member). */
  myRoles: z.array(projectRole),
  memberCount: z.number().int().nonnegative(),
  createdAt: isoTime,
  updatedAt: isoTime,
});
export type Project = z.infer<typeof project>;

export const member = z.strictObject({
  userId: id,
  email: z.string(),
  name: z.string(),
  roles: z.array(projectRole),
});
export type Member = z.infer<typeof member>;

/** GET /api/projects. */
export const projectsResponse = z.strictObject({ projects: z.array(project) });
export type ProjectsResponse = z.infer<typeof projectsResponse>;

/** GET, POST and PATCH of one project. */
export const projectResponse = z.strictObject({ project });
export type ProjectResponse = z.infer<typeof projectResponse>;

/** GET /api/projects/:projectId/members. */
export const membersResponse = z.strictObject({ members: z.array(member) });
export type MembersResponse = z.infer<typeof membersResponse>;

/** POST and PATCH of one member. */
export const memberResponse = z.strictObject({ member });
export type MemberResponse = z.infer<typeof memberResponse>;
