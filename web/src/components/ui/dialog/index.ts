export { Dialog } from './dialog';
