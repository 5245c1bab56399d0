// The shapes the server sends (the foundation contract). Times are ISO-8601 UTC strings.
import type { ProjectRole } from '../config/words';

export type User = {
  id: number;
  email: string;
  name: string;
  isAdmin: boolean;
  licenceNumber: string | null;
  jurisdiction: string | null;
};

export type Project = {
  id: number;
  jobNumber: string;
  name: string;
  client: string;
  site: string;
  myRoles: ProjectRole[];
  memberCount: number;
  createdAt: string;
  updatedAt: string;
};

export type Member = {
  userId: number;
  email: string;
  name: string;
  roles: ProjectRole[];
};

export type ActivityEntry = {
  id: number;
  at: string;
  actor: { id: number; name: string } | null;
  action: string;
  objectType: string;
  objectId: number | string | null;
  details: Record<string, unknown> | null;
  /** The sheet the entry is about, when it still exists. */
  sheet?: { id: number; number: string; title: string };
};
