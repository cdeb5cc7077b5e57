// The engine's validation cases (shared by the tests and `fieldbound check`). Only re-exports live here.
export {
  VALIDATION_CASES,
  runValidation,
  runValidationCase,
  type ValidationCase,
  type ValidationPoint,
  type ValidationResult,
  type ValidationData,
  type SpecialOracle,
  type Exact1dOracle,
  type Tolerance,
} from './validationCases.js';
