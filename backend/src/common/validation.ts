import { BadRequestException, ValidationPipe, type ValidationError } from '@nestjs/common';

/** The body of every 400 caused by invalid input: one list of messages per field. */
export interface ValidationErrorBody {
  statusCode: 400;
  message: string;
  errors: Record<string, string[]>;
}

/** Flattens class-validator's tree into `{ 'field' | 'parent.child': [messages] }`. */
export function fieldErrors(errors: ValidationError[], parent = ''): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const error of errors) {
    const field = parent ? `${parent}.${error.property}` : error.property;
    if (error.constraints) {
      out[field] = Object.entries(error.constraints).map(([rule, text]) =>
        rule === 'whitelistValidation' ? 'This field is not expected here.' : text,
      );
    }
    if (error.children?.length) Object.assign(out, fieldErrors(error.children, field));
  }
  return out;
}

export function validationException(errors: ValidationError[]): BadRequestException {
  const body: ValidationErrorBody = {
    statusCode: 400,
    message: 'Some fields need attention.',
    errors: fieldErrors(errors),
  };
  return new BadRequestException(body);
}

/** A single-field error in the same shape, for checks only the service can make (e.g. "current password is wrong"). */
export function fieldError(field: string, message: string): BadRequestException {
  const body: ValidationErrorBody = { statusCode: 400, message, errors: { [field]: [message] } };
  return new BadRequestException(body);
}

/** The one global pipe: strips nothing silently (unknown fields are errors), transforms to DTO classes. */
export function createValidationPipe(): ValidationPipe {
  return new ValidationPipe({
    whitelist: true,
    forbidNonWhitelisted: true,
    forbidUnknownValues: true,
    transform: true,
    exceptionFactory: validationException,
  });
}
