import { BadRequestException, ConflictException, GoneException } from '@nestjs/common';
import { type MapSetup, validateSetup } from '@fieldbound/shared';

/**
 * 409 for a write based on a stale version: the body carries the current state so the client can
 * show what changed and let the person merge; nothing was written.
 */
export function versionConflict<T>(what: 'map' | 'pin', current: T): ConflictException {
  return new ConflictException({
    statusCode: 409,
    code: 'version_conflict',
    message: `This ${what} was changed by someone else since you loaded it. Review the current version, then apply your change again.`,
    current,
  });
}

/**
 * Validates a setup with the engine's own schema; a 400 names every offending field under `setup.`
 * (e.g. `setup.alphaAxis.min`), in the same shape as the other field errors.
 */
export function validSetupOrThrow(input: unknown): MapSetup {
  const result = validateSetup(input);
  if (result.ok) return result.setup;
  const errors: Record<string, string[]> = {};
  for (const issue of result.issues) {
    const key = issue.path === '(setup)' ? 'setup' : `setup.${issue.path}`;
    (errors[key] ??= []).push(issue.message);
  }
  const count = result.issues.length;
  throw new BadRequestException({ statusCode: 400, message: `The setup has ${count} problem${count === 1 ? '' : 's'}.`, errors });
}

export function restoreWindowPassed(): GoneException {
  return new GoneException({ statusCode: 410, code: 'restore_window_passed', message: 'This map was deleted too long ago to be restored.' });
}

/** PNG signature followed by the IHDR chunk header. */
export function isPng(bytes: Buffer): boolean {
  const signature = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
  return bytes.length >= 24 && signature.every((b, i) => bytes[i] === b) && bytes.subarray(12, 16).toString('latin1') === 'IHDR';
}
