// The project roles are part of the shared vocabulary (core/vocabulary.ts).
export { PROJECT_ROLES, type ProjectRole } from '../../../core/vocabulary';
