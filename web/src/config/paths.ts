import { placeQuery } from '../lib/place';

// Every client-side address in one place, so links and redirects agree.
export const paths = {
  signIn: {
    path: '/sign-in',
    href: (redirectTo?: string | null) =>
      redirectTo && redirectTo !== '/'
        ? `/sign-in?redirectTo=${encodeURIComponent(redirectTo)}`
        : '/sign-in',
  },
  resetPassword: { path: '/reset-password', href: () => '/reset-password' },
  projects: { path: '/', href: () => '/' },
  project: {
    path: '/projects/:projectId',
    href: (projectId: number | string) => `/projects/${projectId}`,
  },
  admin: { path: '/admin', href: () => '/admin' },
  package: {
    path: '/projects/:projectId/package',
    href: (projectId: number | string) => `/projects/${projectId}/package`,
  },
  search: { path: '/search', href: (q: string) => `/search?q=${encodeURIComponent(q)}` },
  outbox: { path: '/outbox', href: () => '/outbox' },
  reference: { path: '/reference', href: () => '/reference' },
  templates: { path: '/templates', href: () => '/templates' },
  sheet: {
    path: '/projects/:projectId/sheets/:sheetId',
    /** With a place: the editor opens on that line of that block (lib/place.ts). */
    href: (
      projectId: number | string,
      sheetId: number | string,
      place?: { blockId: string; line: number },
    ) => `/projects/${projectId}/sheets/${sheetId}${place ? placeQuery(place) : ''}`,
  },
  revision: {
    path: '/revisions/:revisionId',
    /** With a place: the line (and the remark, if one is named) marked and in view. */
    href: (
      revisionId: number | string,
      place?: { blockId: string; line: number; remarkId?: number },
    ) => `/revisions/${revisionId}${place ? placeQuery(place) : ''}`,
  },
  print: {
    path: '/revisions/:revisionId/print',
    href: (revisionId: number | string) => `/revisions/${revisionId}/print`,
  },
  compare: {
    path: '/sheets/:sheetId/compare',
    href: (sheetId: number | string, from: number | string, to: number | string) =>
      `/sheets/${sheetId}/compare?from=${from}&to=${to}`,
  },
  verify: {
    path: '/verify',
    codePath: '/verify/:code',
    href: (code?: string) => (code ? `/verify/${encodeURIComponent(code)}` : '/verify'),
  },
} as const;

/**
 * Only same-site paths are followed after sign-in; anything else (another host, `//evil`, a
 * scheme) falls back to the projects list.
 */
export function safeRedirect(target: string | null | undefined): string {
  if (!target || !target.startsWith('/') || target.startsWith('//') || target.startsWith('/\\')) {
    return paths.projects.href();
  }
  if (target.startsWith(paths.signIn.path)) return paths.projects.href();
  return target;
}
