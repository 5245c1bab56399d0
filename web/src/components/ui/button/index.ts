export * from './button';
