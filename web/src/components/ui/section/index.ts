export * from './section';
