/** The roles a person holds within one project (DESIGN §7). Admin is installation-wide. */
export const PROJECT_ROLES = ['author', 'checker', 'principal', 'viewer'] as const;
export type ProjectRole = (typeof PROJECT_ROLES)[number];
