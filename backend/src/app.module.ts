import { type DynamicModule, type MiddlewareConsumer, Module, type NestModule } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';
import { MikroOrmModule } from '@mikro-orm/nestjs';
import { ServeStaticModule } from '@nestjs/serve-static';
import { ThrottlerModule } from '@nestjs/throttler';
import type { AppConfig } from './config/configuration';
import { ormOptions } from './database/mikro-orm.config';
import { HealthModule } from './health/health.module';
import { RequestLoggingMiddleware } from './common/request-logging.middleware';
import { type Clock, ClockModule } from './common/clock';
import { AuditModule } from './audit/audit.module';
import { AuthModule } from './auth/auth.module';
import { InvitationsModule } from './invitations/invitations.module';
import { MailModule } from './mail/mail.module';
import { TeamsModule } from './teams/teams.module';
import { UsersModule } from './users/users.module';
import { MapsModule } from './maps/maps.module';
import { SpeciesModule } from './species/species.module';
import { PinsModule } from './pins/pins.module';
import { ViewingLinksModule } from './viewing-links/viewing-links.module';
import { DemoModule } from './demo/demo.module';
import { LiveModule } from './live/live.module';
import { PostgresThrottlerStorage } from './rate-limit/postgres-throttler.storage';
import { RateLimitModule } from './rate-limit/rate-limit.module';

export interface AppModuleOptions {
  /** Replaces the system clock (tests move time forward with it). */
  clock?: Clock;
}

/** The root module, built from one configuration so tests and extra instances can run side by side. */
@Module({})
export class AppModule implements NestModule {
  static forRoot(config: AppConfig, options: AppModuleOptions = {}): DynamicModule {
    const staticSite = config.staticDir
      ? // The built single-page app, served from the same origin as the API.
        [ServeStaticModule.forRoot({ rootPath: config.staticDir, exclude: ['/api/{*path}'] })]
      : [];
    return {
      module: AppModule,
      imports: [
        ConfigModule.forRoot({ isGlobal: true, ignoreEnvFile: true, load: [() => config] }),
        MikroOrmModule.forRoot({ ...ormOptions(config.database), registerRequestContext: true }),
        ClockModule.forRoot(options.clock),
        // Applied only where a route says @UseGuards(ThrottlerGuard): sign-in, register, password reset.
        // Counters live in PostgreSQL so limits hold across server instances (src/rate-limit/).
        ThrottlerModule.forRootAsync({
          imports: [RateLimitModule],
          inject: [PostgresThrottlerStorage],
          useFactory: (storage: PostgresThrottlerStorage) => ({
            throttlers: [{ name: 'default', ttl: config.auth.rateLimit.windowSeconds * 1000, limit: config.auth.rateLimit.limit }],
            errorMessage: 'Too many attempts from this address. Wait a minute, then try again.',
            storage,
          }),
        }),
        ...staticSite,
        HealthModule,
        MailModule,
        AuditModule,
        AuthModule,
        UsersModule,
        TeamsModule,
        InvitationsModule,
        SpeciesModule,
        MapsModule,
        PinsModule,
        ViewingLinksModule,
        LiveModule,
        DemoModule,
      ],
    };
  }

  configure(consumer: MiddlewareConsumer): void {
    consumer.apply(RequestLoggingMiddleware).forRoutes('{*path}');
  }
}
