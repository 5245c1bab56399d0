/**
 * The engine's second entry point, for helper threads: the dense solver's parallel steps and the
 * team contract alone. A helper imports this instead of `./index` so that it does not load the
 * sheet engine (mathjs) it never uses.
 */
export { DENSE_TASKS } from './eigen/dense/tasks';
export type { DenseTask, DenseTeam } from './eigen/dense/team';
export { warmUpDenseSteps } from './eigen/dense/warm-up';
