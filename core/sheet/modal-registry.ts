/**
 * What a response block needs of a modes block above it and the scope object does not carry: the
 * engine's frequencies, shapes and mass matrix, its influence directions and DOF labels. Keyed by
 * the object bound under the modes block's name, so a name rebound below no longer finds it.
 */
import type { InfluenceVector } from '../eigen/types';
import type { ModalBasis } from '../response/types';

export interface RegisteredModes {
  basis: ModalBasis;
  influence: InfluenceVector[];
  dofLabels: string[] | null;
  blockId: string;
}

export const MODAL_RESULTS = new WeakMap<object, RegisteredModes>();
