/**
 * Version of the engine that produced a result. Results (maps, level lists, CLI output) are a pure
 * function of their input and this version; it equals the `version` field of shared/package.json
 * (checked by `version.test.ts`). Bump both together whenever the numbers an engine function returns
 * can change.
 *
 * History:
 * - 0.2.0: cheaper map build (values move within their error estimates); width table with extra p nodes near
 *   pole switches (widths of broad resonances change at m = 9, 12, 15).
 * - 0.1.0: first engine.
 *
 * @example
 * ENGINE_VERSION // '0.2.0'
 */
export const ENGINE_VERSION = '0.2.0';
