/**
 * The dense solver's parallel steps by name, for the threads of a `DenseTeam` (`./team`): the
 * caller runs a step's function directly and names it, and another thread looks the same
 * function up here.
 */
import { orthogonalityPart } from './orthogonality';
import { backSubstitutePart, congruenceLeftPart, congruenceRightPart } from './reduction';
import { type DenseTask, transposePart } from './team';
import { blockVectorsPart } from './tridiagonal-vectors';
import { backTransformPart, symmetricProductPart, trailingUpdatePart } from './tridiagonalize';

export const DENSE_TASKS: Readonly<Record<string, DenseTask>> = {
  backSubstitute: backSubstitutePart,
  backTransform: backTransformPart,
  congruenceLeft: congruenceLeftPart,
  congruenceRight: congruenceRightPart,
  orthogonality: orthogonalityPart,
  symmetricProduct: symmetricProductPart,
  trailingUpdate: trailingUpdatePart,
  transpose: transposePart,
  tridiagonalVectors: blockVectorsPart,
};
