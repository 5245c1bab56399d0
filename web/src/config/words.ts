// The product's words for things the server names by code (DESIGN.md §2).
export const PRODUCT_NAME = 'Modewright';

export const CAUTION =
  'Results must be verified by a qualified engineer; built-in criteria do not replace the codes ' +
  'adopted by the authority having jurisdiction or licensed professional judgement.';

import { PROJECT_ROLES, type ProjectRole } from '../../../core/vocabulary';

export { PROJECT_ROLES, type ProjectRole };

export const ROLE_LABELS: Record<ProjectRole, string> = {
  author: 'Author',
  checker: 'Checker',
  principal: 'Principal',
  viewer: 'Viewer',
};

export function roleLabel(role: string): string {
  return (ROLE_LABELS as Record<string, string | undefined>)[role] ?? role;
}
