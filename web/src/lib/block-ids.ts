export { isGeneratedBlockId } from '../../../core/vocabulary';
