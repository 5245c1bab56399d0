export * from './empty-state';
