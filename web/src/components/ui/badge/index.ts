export * from './badge';
