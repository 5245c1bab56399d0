export * from './types';
export * from './sparse';
export * from './dense';
export * from './ordering';
export * from './skyline';
export * from './factorize';
