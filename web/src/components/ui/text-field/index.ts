export * from './text-field';
