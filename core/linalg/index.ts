export * from './types';
export * from './sparse';
