import { createSecretKey } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { PassportStrategy } from '@nestjs/passport';
import { EntityManager } from '@mikro-orm/postgresql';
import { ExtractJwt, Strategy } from 'passport-jwt';
import type { AppConfig } from '../config/configuration';
import type { AuthUser } from '../common/current-user.decorator';
import { ApiError } from '../common/api-error';
import { selectRows } from '../common/sql-reads';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Claims of a Fieldbound access token. */
export interface AccessTokenClaims {
  sub: string;
  email: string;
  /** The user's tokenVersion when the token was issued. */
  ver: number;
}

export const JWT_ISSUER = 'fieldbound';
export const JWT_AUDIENCE = 'fieldbound-api';

/**
 * Verifies `Authorization: Bearer <jwt>` (HS256, issuer, audience, expiry) and then checks that the
 * account still exists and its password has not changed since the token was issued.
 */
@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy, 'jwt') {
  constructor(
    config: ConfigService<AppConfig, true>,
    private readonly em: EntityManager,
  ) {
    super({
      jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
      // A KeyObject made once: given a string, jsonwebtoken first tries (and fails) to parse it as a public
      // key on every request — an exception path that cost ~2 ms of CPU per call under load (docs/loadtest.md).
      // (jsonwebtoken.verify accepts a KeyObject; passport-jwt's types only list string | Buffer.)
      secretOrKey: createSecretKey(config.get('jwtSecret', { infer: true }), 'utf8') as unknown as Buffer,
      algorithms: ['HS256'],
      issuer: JWT_ISSUER,
      audience: JWT_AUDIENCE,
      ignoreExpiration: false,
    });
  }

  async validate(claims: AccessTokenClaims): Promise<AuthUser> {
    // On every signed-in request: one plain statement (common/sql-reads.ts), not an ORM lookup.
    const rows = typeof claims.sub === 'string' && UUID.test(claims.sub)
      ? await selectRows<{ id: string; email: string; token_version: number }>(this.em, 'select id, email, token_version from users where id = ?', [claims.sub])
      : [];
    const user = rows[0] ? { id: rows[0].id, email: rows[0].email, tokenVersion: rows[0].token_version } : null;
    if (!user) throw new ApiError(401, 'access_token_invalid', 'The account of this access token no longer exists; sign in again.');
    if (user.tokenVersion !== claims.ver) {
      throw new ApiError(401, 'access_token_revoked', 'This access token was revoked when the password changed; sign in again.');
    }
    return { id: user.id, email: user.email };
  }
}
