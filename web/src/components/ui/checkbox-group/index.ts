export * from './checkbox-group';
