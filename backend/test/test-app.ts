import crypto from 'node:crypto';
import type { INestApplication } from '@nestjs/common';
import { createApp } from '../src/app.factory';
import { Clock } from '../src/common/clock';
import { loadConfig, type AppConfig } from '../src/config/configuration';

export interface TestApp {
  app: INestApplication;
  baseUrl: string;
  config: AppConfig;
  close(): Promise<void>;
}

export interface TestAppOverrides extends Partial<Omit<AppConfig, 'auth' | 'mail'>> {
  auth?: Partial<AppConfig['auth']>;
  mail?: Partial<AppConfig['mail']>;
}

/** A clock the test moves by hand. Starts at the real time. */
export class TestClock extends Clock {
  private offsetMs = 0;
  now(): Date {
    return new Date(Date.now() + this.offsetMs);
  }
  advance(ms: number): void {
    this.offsetMs += ms;
  }
}

/**
 * The real application on an ephemeral loopback port, against the test database, with the local
 * mail fake and (unless a test asks for less) rate limits high enough not to get in the way.
 * Several can run at once against the one database, like server instances behind a load balancer.
 */
export async function startTestApp(overrides: TestAppOverrides = {}, options: { clock?: Clock; logs?: 'json' | 'silent' } = {}): Promise<TestApp> {
  const base = loadConfig();
  const config: AppConfig = {
    ...base,
    staticDir: null,
    port: 0,
    // Rate-limit counters are shared through the database: each app counts on its own unless a test
    // (two instances sharing a limit) passes the same scope to both.
    rateLimitScope: crypto.randomUUID(),
    ...overrides,
    auth: { ...base.auth, rateLimit: { limit: 10_000, windowSeconds: 60 }, ...overrides.auth },
    // No background mail retries: tests that need them call InvitationMailRetryService.deliverDue().
    mail: { ...base.mail, smtpUrl: null, fakePort: 0, retryIntervalSeconds: 0, ...overrides.mail },
  };
  const app = await createApp({ logs: options.logs ?? 'silent', config, clock: options.clock });
  await app.listen(0, '127.0.0.1');
  const address = app.getHttpServer().address() as { port: number };
  return { app, config, baseUrl: `http://127.0.0.1:${address.port}/api`, close: () => app.close() };
}
