// Response analyses on a modal basis: spectra, modal and directional combination, response-
// spectrum analysis, harmonic response, modal time histories, walking response. See README.md.
export * from './types';
export {
  checkBasis,
  modalFactors,
  dampingPerMode,
  rayleighCoefficients,
  rayleighRatio,
  type ModalFactors,
} from './modal-basis';
export * from './spectra';
export * from './combination';
export * from './spectrum-analysis';
export * from './harmonic';
export * from './time-history';
export * from './walking';
