import { DomainError } from '../errors.js';

/** Throws `DomainError` unless `value` is finite; returns it. Internal to the units module. */
export function finite(parameter: string, value: number): number {
  if (!Number.isFinite(value)) throw new DomainError(parameter, `must be a finite number, got ${value}`);
  return value;
}
