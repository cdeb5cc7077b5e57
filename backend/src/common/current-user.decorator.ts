import { createParamDecorator, type ExecutionContext, UnauthorizedException } from '@nestjs/common';
import type { Request } from 'express';

/** What the JWT strategy attaches to the request once an access token is verified. */
export interface AuthUser {
  id: string;
  email: string;
}

export type AuthenticatedRequest = Request & { user?: AuthUser };

/**
 * The signed-in user of the request (`@CurrentUser() user: AuthUser`).
 * Only meaningful on non-public routes; on a public route it throws 401 if nobody is signed in.
 */
export const CurrentUser = createParamDecorator((_data: unknown, context: ExecutionContext): AuthUser => {
  const request = context.switchToHttp().getRequest<AuthenticatedRequest>();
  if (!request.user) throw new UnauthorizedException({ statusCode: 401, code: 'not_signed_in', message: 'Sign in to continue.' });
  return request.user;
});
