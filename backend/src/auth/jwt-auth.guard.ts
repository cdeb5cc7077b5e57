import { type ExecutionContext, HttpException, Injectable } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { AuthGuard } from '@nestjs/passport';
import { IS_PUBLIC_KEY } from '../common/public.decorator';
import { ApiError } from '../common/api-error';
import { isDatabaseUnavailableError } from '../common/database-unavailable.filter';
import type { AuthUser } from '../common/current-user.decorator';

/**
 * Registered globally (APP_GUARD): every route needs a valid access token unless it, or its
 * controller, is marked `@Public()`. Refusals say why, with a stable `code`:
 * `not_signed_in`, `access_token_expired`, `access_token_invalid`, `access_token_revoked`.
 */
@Injectable()
export class JwtAuthGuard extends AuthGuard('jwt') {
  constructor(private readonly reflector: Reflector) {
    super();
  }

  override canActivate(context: ExecutionContext) {
    const isPublic = this.reflector.getAllAndOverride<boolean>(IS_PUBLIC_KEY, [context.getHandler(), context.getClass()]);
    if (isPublic) return true;
    return super.canActivate(context);
  }

  override handleRequest<TUser = AuthUser>(err: unknown, user: TUser | false, info: unknown): TUser {
    if (err instanceof HttpException) throw err;
    // The account could not be looked up because the database is away: 503, not "sign in again".
    if (isDatabaseUnavailableError(err)) throw err;
    if (err) throw new ApiError(401, 'access_token_invalid', 'The access token could not be checked; sign in again.');
    if (user) return user;
    if (info instanceof Error && info.name === 'TokenExpiredError') {
      throw new ApiError(401, 'access_token_expired', 'Your access token has expired; refresh the session or sign in again.');
    }
    if (info instanceof Error && /no auth token/i.test(info.message)) {
      throw new ApiError(401, 'not_signed_in', 'Sign in to continue.');
    }
    throw new ApiError(401, 'access_token_invalid', 'The access token is not valid; sign in again.');
  }
}
