import { ConflictException, Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { EntityManager, UniqueConstraintViolationException } from '@mikro-orm/postgresql';
import type { AppConfig } from '../config/configuration';
import { Clock } from '../common/clock';
import { ApiError } from '../common/api-error';
import { fieldError } from '../common/validation';
import { newSecretToken, parseSecretToken, secretMatches } from '../common/secret-token';
import { AuditService } from '../audit/audit.service';
import { MailService } from '../mail/mail.service';
import { passwordChangedMail, passwordResetMail } from '../mail/templates';
import { User } from '../users/user.entity';
import type { ChangePasswordDto, RegisterDto, ResetPasswordDto, SignInDto } from './dto/auth.dto';
import { PasswordResetToken } from './password-reset-token.entity';
import { PasswordService } from './password.service';
import { type ClientMeta, type IssuedSession, SessionService } from './session.service';

/** Account use cases: each validates, changes the unit of work, records audit events, and flushes once. */
@Injectable()
export class AuthService {
  constructor(
    private readonly em: EntityManager,
    private readonly passwords: PasswordService,
    private readonly sessions: SessionService,
    private readonly audit: AuditService,
    private readonly mail: MailService,
    private readonly clock: Clock,
    private readonly config: ConfigService<AppConfig, true>,
  ) {}

  /** Creates an account and signs it in. */
  async register(dto: RegisterDto, meta: ClientMeta): Promise<IssuedSession> {
    const user = await this.createUser(dto.email, dto.displayName, dto.password);
    const session = this.sessions.issue(user, meta);
    user.lastSignInAt = this.clock.now();
    this.audit.record({ action: 'auth.registered', actor: user, ip: meta.ip });
    await this.flushNewUser();
    return session;
  }

  /** A new, persisted (not flushed) user; 409 on the e-mail field when the address has an account. */
  async createUser(email: string, displayName: string, password: string): Promise<User> {
    const normalised = User.normaliseEmail(email);
    if (await this.em.count(User, { email: normalised })) throw emailTaken();
    const user = new User(normalised, displayName, await this.passwords.hash(password));
    this.em.persist(user);
    return user;
  }

  /** Flushes a use case that created a user; a concurrent registration of the same address becomes a 409. */
  async flushNewUser(): Promise<void> {
    try {
      await this.em.flush();
    } catch (error) {
      if (error instanceof UniqueConstraintViolationException) throw emailTaken();
      throw error;
    }
  }

  /** Wrong password and unknown e-mail give the same answer after the same amount of work. */
  async signIn(dto: SignInDto, meta: ClientMeta): Promise<IssuedSession> {
    const user = await this.em.findOne(User, { email: User.normaliseEmail(dto.email) }, { populate: ['passwordHash'] });
    const ok = user ? await this.passwords.verify(user.passwordHash, dto.password) : await this.passwords.verifyDecoy(dto.password);
    if (!user || !ok) {
      this.audit.record({ action: 'auth.sign_in_failed', targetUserId: user?.id ?? null, targetEmail: User.normaliseEmail(dto.email), ip: meta.ip });
      await this.em.flush();
      throw new ApiError(401, 'invalid_credentials', 'The e-mail address or the password is not correct.');
    }
    const session = this.sessions.issue(user, meta);
    user.lastSignInAt = this.clock.now();
    this.audit.record({ action: 'auth.signed_in', actor: user, ip: meta.ip, details: meta.userAgent ? { userAgent: meta.userAgent.slice(0, 200) } : null });
    await this.em.flush();
    return session;
  }

  async signOut(refreshToken: string | undefined, meta: ClientMeta): Promise<void> {
    const user = await this.sessions.revokeByToken(refreshToken);
    if (!user) return;
    this.audit.record({ action: 'auth.signed_out', actor: user, ip: meta.ip });
    await this.em.flush();
  }

  /** Checks the current password, stores the new hash, signs out every other session, keeps this one. */
  async changePassword(userId: string, dto: ChangePasswordDto, meta: ClientMeta): Promise<IssuedSession> {
    const user = await this.em.findOneOrFail(User, { id: userId }, { populate: ['passwordHash'] });
    if (!(await this.passwords.verify(user.passwordHash, dto.currentPassword))) {
      throw fieldError('currentPassword', 'The current password is not correct.');
    }
    if (dto.newPassword === dto.currentPassword) throw fieldError('newPassword', 'Choose a password different from the current one.');
    const now = this.clock.now();
    user.passwordHash = await this.passwords.hash(dto.newPassword);
    user.tokenVersion += 1;
    await this.sessions.revokeAllForUser(user.id, now);
    const session = this.sessions.issue(user, meta);
    this.audit.record({ action: 'auth.password_changed', actor: user, ip: meta.ip });
    await this.em.flush();
    void this.mail.sendInBackground(passwordChangedMail({ to: user.email, displayName: user.displayName, when: now, publicUrl: this.publicUrl }));
    return session;
  }

  /**
   * Sends a one-time reset link when the address has an account. The answer never says whether it
   * does, and the mail goes out in the background so the timing does not tell either.
   */
  async forgotPassword(email: string, meta: ClientMeta): Promise<void> {
    const user = await this.em.findOne(User, { email: User.normaliseEmail(email) });
    if (!user) return;
    const now = this.clock.now();
    const secret = newSecretToken();
    const expiresAt = new Date(now.getTime() + this.config.get('auth', { infer: true }).passwordResetTtlSeconds * 1000);
    this.em.persist(new PasswordResetToken({ id: secret.id, user, tokenHash: secret.hash, createdAt: now, expiresAt }));
    this.audit.record({ action: 'auth.password_reset_requested', targetUserId: user.id, targetEmail: user.email, ip: meta.ip });
    await this.em.flush();
    void this.mail.sendInBackground(
      passwordResetMail({ to: user.email, displayName: user.displayName, link: `${this.publicUrl}/reset-password/${secret.token}`, expiresAt }),
    );
  }

  /** Whom a reset link is for, if it can still be used (401 forged, 410 used or expired). */
  async checkResetToken(token: string): Promise<{ email: string; expiresAt: string }> {
    const reset = await this.usableResetToken(token);
    return { email: reset.user.email, expiresAt: reset.expiresAt.toISOString() };
  }

  /** Sets the new password, uses up every open reset link of the account and signs it out everywhere. */
  async resetPassword(dto: ResetPasswordDto, meta: ClientMeta): Promise<{ email: string }> {
    const reset = await this.usableResetToken(dto.token);
    const now = this.clock.now();
    const user = reset.user;
    user.passwordHash = await this.passwords.hash(dto.password);
    user.tokenVersion += 1;
    reset.usedAt = now;
    await this.em.nativeUpdate(PasswordResetToken, { user: user.id, usedAt: null, id: { $ne: reset.id } }, { usedAt: now });
    await this.sessions.revokeAllForUser(user.id, now);
    this.audit.record({ action: 'auth.password_reset', actor: user, ip: meta.ip });
    await this.em.flush();
    return { email: user.email };
  }

  private async usableResetToken(token: string): Promise<PasswordResetToken> {
    const parsed = parseSecretToken(token);
    const reset = parsed ? await this.em.findOne(PasswordResetToken, { id: parsed.id }, { populate: ['user'] }) : null;
    if (!parsed || !reset || !secretMatches(parsed.secret, reset.tokenHash)) {
      throw new ApiError(401, 'reset_token_invalid', 'This reset link is not valid. Ask for a new one.');
    }
    if (reset.usedAt) throw new ApiError(410, 'reset_token_used', 'This reset link was already used. Ask for a new one if you still need it.');
    if (reset.expiresAt.getTime() <= this.clock.now().getTime()) {
      throw new ApiError(410, 'reset_token_expired', 'This reset link has expired. Ask for a new one.');
    }
    return reset;
  }

  private get publicUrl(): string {
    return this.config.get('publicUrl', { infer: true });
  }
}

function emailTaken(): ConflictException {
  return new ConflictException({
    statusCode: 409,
    code: 'email_taken',
    message: 'An account with this e-mail address already exists.',
    errors: { email: ['An account with this e-mail address already exists. Sign in, or reset the password.'] },
  });
}

