import type { FormInstance, FormRule as Rule } from 'antd';
import { ApiError } from '../api/client';

/**
 * Puts the server's per-field messages beside the fields of an antd form.
 * Returns the message to show above the form when the error is not about particular fields.
 */
export function applyServerErrors(form: FormInstance, error: unknown, fields: string[]): string | null {
  if (!(error instanceof Error)) return 'Something went wrong. Try again.';
  if (error instanceof ApiError) {
    const perField = Object.entries(error.fieldErrors).filter(([name]) => fields.includes(name));
    if (perField.length) {
      form.setFields(perField.map(([name, errors]) => ({ name, errors })));
      const others = Object.keys(error.fieldErrors).filter((name) => !fields.includes(name));
      return others.length ? error.message : null;
    }
  }
  return error.message;
}

export const PASSWORD_MIN = 10;

export const emailRules: Rule[] = [
  { required: true, whitespace: true, message: 'Enter your e-mail address.' },
  { type: 'email', message: 'Enter a valid e-mail address, such as name@institute.edu.' },
  { max: 254, message: 'An e-mail address has at most 254 characters.' },
];

export const newPasswordRules: Rule[] = [
  { required: true, message: 'Choose a password.' },
  { min: PASSWORD_MIN, message: `A password needs at least ${PASSWORD_MIN} characters.` },
  { max: 128, message: 'A password has at most 128 characters.' },
];

/** Confirmation must equal the field `other`. */
export function sameAs(other: string, message = 'The two passwords differ.'): Rule {
  return ({ getFieldValue }) => ({
    validator: (_rule, value) => (!value || getFieldValue(other) === value ? Promise.resolve() : Promise.reject(new Error(message))),
  });
}

export const nameRules: Rule[] = [
  { required: true, whitespace: true, message: 'Enter your name.' },
  { max: 100, message: 'A name has at most 100 characters.' },
];
