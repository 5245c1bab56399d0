// The engine's typed errors are part of the public surface (the API maps them to 422).
export * from '../errors';
export * from './types';
export * from './sparse';
export * from './dense';
export * from './ordering';
export * from './skyline';
export * from './factorize';
export * from './matrix-io';
export * from './sparse-ldlt/index';
