export * from './types';
export * from './storey-chain';
export * from './euler-bernoulli-beam';
export * from './large-models';
