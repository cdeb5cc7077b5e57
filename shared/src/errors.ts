/**
 * Named error classes shared by every layer of the engine.
 *
 * Each class sets a stable `name` so that errors crossing a worker boundary
 * (which passes only `name`, `message` and `stack`) can still be told apart.
 */

/**
 * Invalid input to an engine entry point (configuration, parameters).
 *
 * @example
 * throw new EngineInputError('alpha', 'must be positive and finite');
 * // EngineInputError: alpha: must be positive and finite
 */
export class EngineInputError extends Error {
  override name = 'EngineInputError';
  constructor(
    public readonly parameter: string,
    message: string,
  ) {
    super(`${parameter}: ${message}`);
  }
}

/**
 * A numeric argument outside the mathematical domain of a function
 * (non-finite, negative where positivity is required, non-integer order, ...).
 *
 * @example
 * throw new DomainError('x', 'must be finite and > 0, got -1');
 */
export class DomainError extends EngineInputError {
  override name = 'DomainError';
}

/**
 * An unknown unit name passed to a unit conversion.
 *
 * @example
 * throw new UnitError('unit', "unknown energy unit 'erg'");
 */
export class UnitError extends EngineInputError {
  override name = 'UnitError';
}
