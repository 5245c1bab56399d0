import type { Request, RequestHandler } from 'express';
import { z } from 'zod';
import { EVALUATING_ROLES, type ProjectRole } from '../../core/vocabulary';
import { currentUser } from './auth';
import { ForbiddenError, NotFoundError } from './errors';
import { idParam, parse } from './validate';

/**
 * The one access policy: who may do what in a project. Every route and service asks it, by
 * action, through `ctx.access`; the table below is the whole of the rules.
 *
 * - Every action needs membership of the project (any role), except for an admin.
 * - `roles`: the action needs one of these roles. `adminWithoutRole`: an admin passes without
 *   holding one (the admin screens); otherwise an admin needs the role like anyone else (only a
 *   project's own authors write its sheets, only its principal seals).
 */
export interface AccessRule {
  roles: readonly ProjectRole[] | null;
  adminWithoutRole: boolean;
  /** The refusal's verb phrase: "Only an author of this project can <doing>." */
  doing: string;
}

const member = (doing = 'do this'): AccessRule => ({ roles: null, adminWithoutRole: true, doing });
const only = (roles: readonly ProjectRole[], doing: string): AccessRule => ({
  roles,
  adminWithoutRole: false,
  doing,
});

export const ACCESS_RULES = {
  'project.read': member(),
  'sheet.read': member(),
  // The unissued draft and the firm's working record (remarks, saves, refusals in the activity);
  // a viewer reads the issued revisions and the client-facing activity.
  'sheet.read_internal': {
    roles: ['author', 'checker', 'principal'],
    adminWithoutRole: true,
    doing:
      'read a sheet’s unissued draft and its working history (a viewer reads its issued revisions)',
  },
  // Queue an evaluation of the editor's text (work for the queue's workers): the people who edit
  // or check the sheet; a viewer reads issued revisions, and an admin needs a role like anyone.
  'sheet.evaluate': only(EVALUATING_ROLES, 'evaluate a sheet'),
  'sheet.create': only(['author'], 'start a sheet'),
  'sheet.rename': only(['author'], 'rename a sheet'),
  'sheet.edit': only(['author'], 'edit a sheet'),
  'sheet.delete': only(['author'], 'delete a sheet'),
  'upload.add': only(['author'], 'upload matrix files'),
  'revision.issue': only(['author'], 'issue a sheet for check'),
  'revision.return': only(['checker'], 'return a revision'),
  'revision.sign_off': only(['checker'], 'sign off a revision'),
  'remark.add': only(['checker'], 'leave remarks'),
  'remark.reply': only(['author', 'checker'], 'reply to remarks'),
  'remark.set_state': only(['checker'], 'close or reopen remarks'),
  'revision.seal': only(['principal'], 'seal a revision'),
  // The firm's library: a project's authors add to it, and an admin may without the role.
  'template.save': {
    roles: ['author'],
    adminWithoutRole: true,
    doing: 'save a sheet as a firm template',
  },
} as const satisfies Record<string, AccessRule>;

export type AccessAction = keyof typeof ACCESS_RULES;

/** Who a refusal names: "an author", "a checker", "the principal", "a checker or principal". */
const ROLE_NOUN: Record<ProjectRole, string> = {
  author: 'an author',
  checker: 'a checker',
  principal: 'the principal',
  viewer: 'a viewer',
};
function whoMay(roles: readonly ProjectRole[]): string {
  if (roles.length === 1) return ROLE_NOUN[roles[0]!];
  const first = roles[0]!;
  const article = /^[aeiou]/.test(first) ? 'an' : 'a';
  return `${article} ${roles.slice(0, -1).join(', ')} or ${roles.at(-1)}`;
}

/** The person as the policy sees them. */
export interface Actor {
  id: number;
  isAdmin: boolean;
}

/** Applies one rule to the roles the person holds in the project; throws 403 when it refuses. */
export function decide(rule: AccessRule, actor: Actor, held: readonly ProjectRole[]): void {
  if (held.length === 0 && !actor.isAdmin) {
    throw new ForbiddenError('You are not a member of this project.');
  }
  if (!rule.roles) return;
  if (actor.isAdmin && rule.adminWithoutRole) return;
  if (!rule.roles.some((r) => held.includes(r))) {
    throw new ForbiddenError(`Only ${whoMay(rule.roles)} of this project can ${rule.doing}.`);
  }
}

/** Whether the rule of `action` lets the person through, for a reply that leaves things out. */
export function permits(action: AccessAction, actor: Actor, held: readonly ProjectRole[]): boolean {
  try {
    decide(ACCESS_RULES[action], actor, held);
    return true;
  } catch {
    return false;
  }
}

/** How the policy finds its way up from a remark to its project (handed in by createApp). */
export interface AccessLookups {
  projectExists(projectId: number): Promise<boolean>;
  rolesOf(projectId: number, userId: number): Promise<ProjectRole[]>;
  projectOfSheet(sheetId: number): Promise<number | undefined>;
  sheetOfRevision(revisionId: number): Promise<number | undefined>;
  revisionOfRemark(remarkId: number): Promise<number | undefined>;
}

/** What a granted check returns: where the thing sits, and the roles the person holds there. */
export interface ProjectScope {
  projectId: number;
  myRoles: ProjectRole[];
}
export interface SheetScope extends ProjectScope {
  sheetId: number;
}
export interface RevisionScope extends SheetScope {
  revisionId: number;
}

export interface Access {
  /** 404 for a missing project, else the rule (403). */
  project(actor: Actor, projectId: number, action: AccessAction): Promise<ProjectScope>;
  /** 404 for a missing sheet, else as for its project. */
  sheet(actor: Actor, sheetId: number, action: AccessAction): Promise<SheetScope>;
  /** 404 for a missing revision, else as for its sheet. */
  revision(actor: Actor, revisionId: number, action: AccessAction): Promise<RevisionScope>;
  /** 404 for a missing remark, else as for its revision. */
  remark(actor: Actor, remarkId: number, action: AccessAction): Promise<RevisionScope>;
  /**
   * Route middleware for `/:projectId/…`: 401 signed out, 422 for a bad id, 404, else the rule
   * (an action of the table, or a rule of its own).
   */
  requireProject(rule: AccessAction | AccessRule): RequestHandler;
}

const projectParams = z.object({ projectId: idParam('project id') });

export function createAccess(lookups: AccessLookups): Access {
  async function inProject(actor: Actor, projectId: number, rule: AccessRule) {
    const myRoles = await lookups.rolesOf(projectId, actor.id);
    decide(rule, actor, myRoles);
    return { projectId, myRoles };
  }
  async function sheet(actor: Actor, sheetId: number, action: AccessAction) {
    const projectId = await lookups.projectOfSheet(sheetId);
    if (projectId === undefined) throw new NotFoundError(`There is no sheet with id ${sheetId}.`);
    return { ...(await inProject(actor, projectId, ACCESS_RULES[action])), sheetId };
  }
  async function revision(actor: Actor, revisionId: number, action: AccessAction) {
    const sheetId = await lookups.sheetOfRevision(revisionId);
    if (sheetId === undefined) {
      throw new NotFoundError(`There is no revision with id ${revisionId}.`);
    }
    return { ...(await sheet(actor, sheetId, action)), revisionId };
  }
  return {
    async project(actor, projectId, action) {
      if (!(await lookups.projectExists(projectId))) {
        throw new NotFoundError(`There is no project with id ${projectId}.`);
      }
      return inProject(actor, projectId, ACCESS_RULES[action]);
    },
    sheet,
    revision,
    async remark(actor, remarkId, action) {
      const revisionId = await lookups.revisionOfRemark(remarkId);
      if (revisionId === undefined) {
        throw new NotFoundError(`There is no remark with id ${remarkId}.`);
      }
      return revision(actor, revisionId, action);
    },
    requireProject(ruleOrAction) {
      const rule = typeof ruleOrAction === 'string' ? ACCESS_RULES[ruleOrAction] : ruleOrAction;
      return async (req: Request, _res, next) => {
        const user = currentUser(req);
        const { projectId } = parse(projectParams, req.params, 'params');
        if (!(await lookups.projectExists(projectId))) {
          throw new NotFoundError(`There is no project with id ${projectId}.`);
        }
        await inProject(user, projectId, rule);
        next();
      };
    },
  };
}
