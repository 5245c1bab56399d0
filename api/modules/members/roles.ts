// The project roles are part of the shared vocabulary (shared/vocabulary.ts).
export { PROJECT_ROLES, type ProjectRole } from '../../../shared/vocabulary';
