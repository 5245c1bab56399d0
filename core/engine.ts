/**
 * The engine's third entry point, for the command line and the bench: the matrices, the eigen
 * solvers and the model generators, without the sheet engine. Importing `./index` loads mathjs
 * and the whole sheet language, seconds of start-up a one-shot solve never uses.
 */
export * from './linalg/index';
export * from './eigen/index';
export * from './response/index';
