/**
 * The version of the sheet engine (parser, evaluator, display rules and eigen engine together).
 * It is part of every digest: change it whenever the same sheet could give different results.
 */
export const ENGINE_VERSION = 'modewright-sheet 0.5.5 (mathjs 15.2.0)';
