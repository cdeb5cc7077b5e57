import { describe, expect, it } from 'vitest';
import { ValidationError } from 'class-validator';
import { fieldErrors } from './validation';
import { redactPath } from './request-logging.middleware';
import { newSecretToken, parseSecretToken, secretMatches } from './secret-token';

function error(property: string, constraints?: Record<string, string>, children: ValidationError[] = []): ValidationError {
  return Object.assign(new ValidationError(), { property, constraints, children });
}

describe('fieldErrors', () => {
  it('gives one list of messages per field, nested fields as dotted paths, unknown fields a plain message', () => {
    const errors = [
      error('email', { isEmail: 'Enter a valid e-mail address.', maxLength: 'Too long.' }),
      error('setup', undefined, [error('field', { min: 'Must be positive.' })]),
      error('extra', { whitelistValidation: 'property extra should not exist' }),
    ];
    expect(fieldErrors(errors)).toEqual({
      email: ['Enter a valid e-mail address.', 'Too long.'],
      'setup.field': ['Must be positive.'],
      extra: ['This field is not expected here.'],
    });
  });
});

describe('secret tokens', () => {
  it('are <uuid>.<43 base64url chars>; only the matching secret verifies against the stored hash', () => {
    const token = newSecretToken();
    expect(token.token).toMatch(/^[0-9a-f-]{36}\.[A-Za-z0-9_-]{43}$/);
    const parsed = parseSecretToken(token.token)!;
    expect(secretMatches(parsed.secret, token.hash)).toBe(true);
    expect(secretMatches('x'.repeat(43), token.hash)).toBe(false);
    expect(parseSecretToken('abc')).toBeNull();
    expect(parseSecretToken(`${token.id}.short`)).toBeNull();
  });
});

describe('redactPath', () => {
  it('replaces secret-looking segments and keeps plain UUIDs', () => {
    const id = crypto.randomUUID();
    const token = newSecretToken().token;
    expect(redactPath(`/api/invitations/${token}/accept`)).toBe('/api/invitations/:secret/accept');
    expect(redactPath(`/api/teams/${id}/members`)).toBe(`/api/teams/${id}/members`);
  });
});
