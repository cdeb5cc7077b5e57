import { HttpException, HttpStatus, Injectable } from '@nestjs/common';
import { ThrottlerGuard } from '@nestjs/throttler';

/** Views per minute and address on the public route: plenty for a lecture hall behind one NAT, useless for guessing 2²⁵⁶ tokens. */
export const VIEW_RATE_LIMIT = { limit: 120, ttl: 60_000 } as const;

/**
 * Rate limit of `GET /api/view/:token`, independent of the throttlers the application configures for
 * sign-in and the like: its own single throttler, keyed per address (unknown tokens count too).
 */
@Injectable()
export class ViewingLinkThrottlerGuard extends ThrottlerGuard {
  override async onModuleInit(): Promise<void> {
    await super.onModuleInit();
    this.throttlers = [{ name: 'viewing-link', limit: VIEW_RATE_LIMIT.limit, ttl: VIEW_RATE_LIMIT.ttl }];
  }

  protected override async throwThrottlingException(): Promise<void> {
    throw new HttpException(
      { statusCode: 429, code: 'too_many_views', message: 'Too many requests for viewing links from this address. Wait a minute, then try again.' },
      HttpStatus.TOO_MANY_REQUESTS,
    );
  }
}
