export * from './spinner';
