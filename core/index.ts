// The only entry point other folders import from core/.
export * from './linalg/index';
export * from './linalg/upload-analysis';
export * from './eigen/index';
export * from './models/index';
export * from './sheet/index';
export * from './response/index';
export * from './display-units';
