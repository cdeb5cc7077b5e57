import { DomainError } from '../errors.js';

/** Internal argument checks shared by the potential functions. */
export function checkM(m: number): void {
  if (!Number.isSafeInteger(m) || m < 0) throw new DomainError('m', `must be an integer ≥ 0, got ${m}`);
}

export function checkFinite(parameter: string, v: number): void {
  if (!Number.isFinite(v)) throw new DomainError(parameter, `must be finite, got ${v}`);
}

export function checkNonNegative(parameter: string, v: number): void {
  if (!(v >= 0) || !Number.isFinite(v)) throw new DomainError(parameter, `must be finite and ≥ 0, got ${v}`);
}

export function checkPositive(parameter: string, v: number): void {
  if (!(v > 0) || !Number.isFinite(v)) throw new DomainError(parameter, `must be finite and > 0, got ${v}`);
}
