/**
 * Version of the engine that produced a result. Results (maps, level lists, CLI output) are a pure
 * function of their input and this version; it equals the `version` field of shared/package.json
 * (checked by `version.test.ts`). Bump both together whenever the numbers an engine function returns
 * can change.
 *
 * @example
 * ENGINE_VERSION // '0.1.0'
 */
export const ENGINE_VERSION = '0.1.0';
