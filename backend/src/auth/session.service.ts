import crypto from 'node:crypto';
import { Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { JwtService } from '@nestjs/jwt';
import { EntityManager } from '@mikro-orm/postgresql';
import type { AppConfig } from '../config/configuration';
import { Clock } from '../common/clock';
import { ApiError } from '../common/api-error';
import { newSecretToken, parseSecretToken, secretMatches } from '../common/secret-token';
import { AuditService } from '../audit/audit.service';
import { User } from '../users/user.entity';
import { toUserView } from '../users/user.view';
import { JWT_AUDIENCE, JWT_ISSUER, type AccessTokenClaims } from './jwt.strategy';
import { RefreshToken } from './refresh-token.entity';

/** What a successful sign-in, registration or refresh returns: the body, and the cookie to set. */
export interface IssuedSession {
  body: SessionView;
  refreshToken: string;
  refreshExpiresAt: Date;
}

import type { SessionView } from '@fieldbound/shared';

export type { SessionView };

export interface ClientMeta {
  ip?: string | null;
  userAgent?: string | null;
}

/**
 * Sessions: short-lived JWT access tokens plus rotating refresh tokens, grouped in families (one
 * family per sign-in). Refreshing uses the presented token up and issues its successor. A token
 * that was already used, presented again after the grace window, means it was copied: the whole
 * family is revoked, which signs out both the thief and the victim.
 */
@Injectable()
export class SessionService {
  private readonly logger = new Logger('auth');

  constructor(
    private readonly em: EntityManager,
    private readonly jwt: JwtService,
    private readonly config: ConfigService<AppConfig, true>,
    private readonly clock: Clock,
    private readonly audit: AuditService,
  ) {}

  private get auth() {
    return this.config.get('auth', { infer: true });
  }

  /** Persists (does not flush) a new refresh token in `familyId` and signs an access token. */
  issue(user: User, meta: ClientMeta, familyId: string = crypto.randomUUID()): IssuedSession {
    const now = this.clock.now();
    const secret = newSecretToken();
    const refreshExpiresAt = new Date(now.getTime() + this.auth.refreshTokenTtlSeconds * 1000);
    this.em.persist(
      new RefreshToken({ id: secret.id, user, familyId, tokenHash: secret.hash, createdAt: now, expiresAt: refreshExpiresAt, userAgent: meta.userAgent ?? null }),
    );
    return { body: this.accessFor(user), refreshToken: secret.token, refreshExpiresAt };
  }

  accessFor(user: User): SessionView {
    const ttl = this.auth.accessTokenTtlSeconds;
    const claims: AccessTokenClaims = { sub: user.id, email: user.email, ver: user.tokenVersion };
    const accessToken = this.jwt.sign(claims, { expiresIn: ttl, issuer: JWT_ISSUER, audience: JWT_AUDIENCE, algorithm: 'HS256' });
    // jsonwebtoken stamps iat with the real time; report expiry the same way.
    const { exp } = this.jwt.decode<{ exp: number }>(accessToken);
    return { accessToken, accessTokenExpiresAt: new Date(exp * 1000).toISOString(), user: toUserView(user) };
  }

  /** Rotates a refresh token; every refusal is a 401 with its own code and message. */
  async refresh(presented: string | undefined, meta: ClientMeta): Promise<IssuedSession> {
    if (!presented) throw new ApiError(401, 'refresh_token_missing', 'There is no session to refresh; sign in.');
    const parsed = parseSecretToken(presented);
    const token = parsed ? await this.em.findOne(RefreshToken, { id: parsed.id }, { populate: ['user'] }) : null;
    if (!parsed || !token || !secretMatches(parsed.secret, token.tokenHash)) {
      throw new ApiError(401, 'refresh_token_invalid', 'The session token is not valid; sign in again.');
    }
    const now = this.clock.now();
    if (token.revokedAt) throw new ApiError(401, 'refresh_token_revoked', 'This session was ended; sign in again.');
    if (token.expiresAt.getTime() <= now.getTime()) throw new ApiError(401, 'refresh_token_expired', 'Your session has expired; sign in again.');

    if (!token.usedAt) {
      // Claim the token atomically: of two concurrent refreshes only one wins the update.
      const claimed = await this.em.nativeUpdate(RefreshToken, { id: token.id, usedAt: null, revokedAt: null }, { usedAt: now });
      if (claimed === 1) {
        token.usedAt = now;
        const session = this.issue(token.user, meta, token.familyId);
        await this.em.flush();
        return session;
      }
      await this.em.refresh(token);
    }

    const usedAt = token.usedAt ?? now;
    const withinGrace = now.getTime() - usedAt.getTime() <= this.auth.refreshReuseGraceSeconds * 1000;
    if (withinGrace && !token.revokedAt) {
      // Two tabs refreshing at once: give the loser its own successor in the same family.
      const session = this.issue(token.user, meta, token.familyId);
      await this.em.flush();
      return session;
    }
    await this.revokeFamily(token.familyId, now);
    this.audit.record({ action: 'auth.refresh_token_reused', actor: null, targetUserId: token.user.id, targetEmail: token.user.email, ip: meta.ip, details: { familyId: token.familyId } });
    await this.em.flush();
    this.logger.warn({ event: 'auth.refresh_token_reused', user: token.user.id, family: token.familyId });
    throw new ApiError(401, 'refresh_token_reused', 'This session token was already used, so the session was ended for safety; sign in again.');
  }

  /** Ends the sign-in the presented refresh token belongs to; returns its user, if the token was genuine. */
  async revokeByToken(presented: string | undefined): Promise<User | null> {
    const parsed = parseSecretToken(presented);
    if (!parsed) return null;
    const token = await this.em.findOne(RefreshToken, { id: parsed.id }, { populate: ['user'] });
    if (!token || !secretMatches(parsed.secret, token.tokenHash)) return null;
    await this.revokeFamily(token.familyId, this.clock.now());
    return token.user;
  }

  async revokeFamily(familyId: string, now: Date): Promise<void> {
    await this.em.nativeUpdate(RefreshToken, { familyId, revokedAt: null }, { revokedAt: now });
  }

  /** Signs a user out everywhere (password change or reset). */
  async revokeAllForUser(userId: string, now: Date): Promise<void> {
    await this.em.nativeUpdate(RefreshToken, { user: userId, revokedAt: null }, { revokedAt: now });
  }
}
