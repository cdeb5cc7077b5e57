import { HttpException } from '@nestjs/common';

/**
 * An error answer with a stable machine-readable `code` beside the human `message`:
 * `{ statusCode, code, message }`. The frontend switches on `code`, people read `message`.
 */
export class ApiError extends HttpException {
  constructor(status: number, code: string, message: string) {
    super({ statusCode: status, code, message }, status);
  }
}
