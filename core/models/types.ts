import type { SymmetricMatrix } from '../linalg/types';
import type { InfluenceVector } from '../eigen/types';

/** What every model builder returns: the matrices, DOF labels and influence vectors. */
export interface ModelMatrices {
  K: SymmetricMatrix;
  M: SymmetricMatrix;
  /** One label per DOF, e.g. 'u1' (storey 1 sway), 'w3' (deflection at node 3), 'θ3'. */
  dofs: string[];
  influence: InfluenceVector[];
  /** Height of each floor above the base (storey chain, when storey heights are given). */
  heights?: number[];
  /** Position along the beam of the node each DOF belongs to. */
  positions?: number[];
}
