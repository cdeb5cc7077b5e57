import { Body, Controller, Get, HttpCode, Param, Post, Req, Res, UseGuards } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { ThrottlerGuard } from '@nestjs/throttler';
import type { Request, Response } from 'express';
import type { AppConfig } from '../config/configuration';
import { Public } from '../common/public.decorator';
import { CurrentUser, type AuthUser } from '../common/current-user.decorator';
import { readCookie } from '../common/cookies';
import { isDatabaseUnavailableError } from '../common/database-unavailable.filter';
import { AuthService } from './auth.service';
import { ChangePasswordDto, ForgotPasswordDto, RegisterDto, ResetPasswordDto, SignInDto } from './dto/auth.dto';
import { clearRefreshCookie, clientMeta, REFRESH_COOKIE, sendSession } from './refresh-cookie';
import type { IssuedSession, SessionView } from './session.service';
import { SessionService } from './session.service';

/**
 * Who may call what:
 * - public: register, sign-in, refresh, sign-out (they work from the cookie), forgot and reset password;
 * - signed in: change password.
 * Register, sign-in and forgot-password are rate-limited per IP address.
 */
@Controller('auth')
export class AuthController {
  constructor(
    private readonly auth: AuthService,
    private readonly sessions: SessionService,
    private readonly config: ConfigService<AppConfig, true>,
  ) {}

  @Public()
  @UseGuards(ThrottlerGuard)
  @Post('register')
  async register(@Body() dto: RegisterDto, @Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<SessionView> {
    return this.withCookie(res, await this.auth.register(dto, clientMeta(req)));
  }

  @Public()
  @UseGuards(ThrottlerGuard)
  @Post('sign-in')
  @HttpCode(200)
  async signIn(@Body() dto: SignInDto, @Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<SessionView> {
    return this.withCookie(res, await this.auth.signIn(dto, clientMeta(req)));
  }

  /** Trades the refresh cookie for a new access token and a new refresh cookie. */
  @Public()
  @Post('refresh')
  @HttpCode(200)
  async refresh(@Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<SessionView> {
    try {
      return this.withCookie(res, await this.sessions.refresh(readCookie(req, REFRESH_COOKIE), clientMeta(req)));
    } catch (error) {
      // A database outage says nothing about the cookie: keep it, so the session survives the outage.
      if (!isDatabaseUnavailableError(error)) this.clearCookie(res);
      throw error;
    }
  }

  @Public()
  @Post('sign-out')
  @HttpCode(204)
  async signOut(@Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<void> {
    await this.auth.signOut(readCookie(req, REFRESH_COOKIE), clientMeta(req));
    this.clearCookie(res);
  }

  @Post('change-password')
  @HttpCode(200)
  async changePassword(
    @CurrentUser() user: AuthUser,
    @Body() dto: ChangePasswordDto,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<SessionView> {
    return this.withCookie(res, await this.auth.changePassword(user.id, dto, clientMeta(req)));
  }

  /** Always 202 with the same words, whether or not the address has an account. */
  @Public()
  @UseGuards(ThrottlerGuard)
  @Post('forgot-password')
  @HttpCode(202)
  async forgotPassword(@Body() dto: ForgotPasswordDto, @Req() req: Request): Promise<{ message: string }> {
    await this.auth.forgotPassword(dto.email, clientMeta(req));
    return { message: 'If an account uses this address, a link to choose a new password is on its way. It works for one hour.' };
  }

  @Public()
  @Get('reset-password/:token')
  checkResetToken(@Param('token') token: string): Promise<{ email: string; expiresAt: string }> {
    return this.auth.checkResetToken(token);
  }

  @Public()
  @UseGuards(ThrottlerGuard)
  @Post('reset-password')
  @HttpCode(200)
  resetPassword(@Body() dto: ResetPasswordDto, @Req() req: Request): Promise<{ email: string }> {
    return this.auth.resetPassword(dto, clientMeta(req));
  }

  private withCookie(res: Response, session: IssuedSession): SessionView {
    return sendSession(res, session, this.secure);
  }

  private clearCookie(res: Response): void {
    clearRefreshCookie(res, this.secure);
  }

  private get secure(): boolean {
    return this.config.get('auth', { infer: true }).secureCookies;
  }
}
