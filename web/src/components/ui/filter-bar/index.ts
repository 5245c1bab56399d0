export * from './filter-bar';
