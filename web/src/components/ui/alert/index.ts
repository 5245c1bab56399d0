export * from './alert';
