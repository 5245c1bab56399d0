// Generators for large models (plane frames, plane-stress plates, 3D building frames); the
// integrator re-exports this file from core/models/index.ts.
export { buildPlaneFrame, planeFrameElement } from './plane-frame';
export type {
  PlaneFrameInput,
  PlaneFrameLumpedMass,
  PlaneFrameMember,
  PlaneFrameModel,
  PlaneFrameNode,
  PlaneFrameSupport,
} from './plane-frame';
export { buildPlaneStressPlate, quadElement } from './plate';
export type { PlaneStressPlateInput, PlaneStressPlateModel } from './plate';
export { buildBuildingFrame, spaceFrameElement, STEEL_BUILDING_DEFAULTS } from './space-frame';
export type { BuildingFrameInput, BuildingFrameModel, SpaceSection } from './space-frame';
