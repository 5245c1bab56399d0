import { PROJECT_ROLES, ROLE_LABELS } from '../../../config/words';

export const ROLE_OPTIONS = PROJECT_ROLES.map((role) => ({
  value: role,
  label: ROLE_LABELS[role],
}));
