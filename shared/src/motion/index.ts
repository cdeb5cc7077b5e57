// Moving ion: motional field, widths, classes, thermal survival. Only re-exports live here.
export {
  validateMotionSettings,
  ionCyclotronEnergy,
  transverseEnergyAt,
  motionalField,
  motionalFieldVoltPerMetre,
  type MotionSettings,
  type MotionSettingsInput,
} from './motionSettings.js';
export { recoilStretch } from './recoilStretch.js';
export { localShapeNumber } from './localShapeNumber.js';
export { widthTableInto, TABLE_STATUS, WIDTH_TABLE_M_MAX, WIDTH_TABLE_RANGE } from './widthTable.js';
export { WIDTH_TABLE_GENERATOR } from './table/widthTableData.js';
export { stateWidthInto, stateWidthCore, WIDTH_FLAG, DEFAULT_SHAPE_NUMBER } from './stateWidth.js';
export { classifyWidthCode, stateClassName, type MotionStateClass } from './classifyWidth.js';
export { criticalTransverseEnergy, criticalTransverseEnergiesInto, thermalFractionsInto } from './thermalEnsemble.js';
export {
  motionStates,
  type MotionStatesInput,
  type MotionStateInput,
  type MotionStateResult,
  type MotionFlag,
  type ThermalFractions,
} from './motionStates.js';
export { classifyCells, allocateCellMotionOutput, type CellBindings, type CellMotionOutput } from './classifyCells.js';
export { ZeroRangeSolver, powerLawKappa, orbitalsNeeded, type ZeroRangeOptions, type ZeroRangeState, type KappaFunction } from './exact/zeroRangeSolver.js';
export { traceState, type TraceOptions, type TracedState } from './exact/traceState.js';
export { phaseMap, motionSettingsFromSetup, type PhaseMapOptions } from './phaseMap.js';
