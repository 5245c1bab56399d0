export * from './purpose-field';
