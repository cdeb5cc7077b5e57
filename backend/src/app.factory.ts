import { ConsoleLogger, type INestApplication } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import { ConfigService } from '@nestjs/config';
import type { NestExpressApplication } from '@nestjs/platform-express';
import helmet from 'helmet';
import { AppModule } from './app.module';
import { DatabaseUnavailableFilter } from './common/database-unavailable.filter';
import type { Clock } from './common/clock';
import { createValidationPipe } from './common/validation';
import { setupOpenApi } from './common/openapi';
import { loadConfig, type AppConfig } from './config/configuration';

export interface CreateAppOptions {
  /** Structured JSON log lines (default) or none at all (tests). */
  logs?: 'json' | 'silent';
  /** Defaults to the environment's configuration. */
  config?: AppConfig;
  /** Replaces the system clock (tests). */
  clock?: Clock;
}

/** Builds the configured application without listening: shared by main.ts and the integration tests. */
export async function createApp(options: CreateAppOptions = {}): Promise<INestApplication> {
  const logger = options.logs === 'silent' ? false : new ConsoleLogger({ json: true, colors: false });
  const app = await NestFactory.create<NestExpressApplication>(AppModule.forRoot(options.config ?? loadConfig(), { clock: options.clock }), { logger, bufferLogs: false, abortOnError: false });
  app.setGlobalPrefix('api');
  app.use(helmet());
  app.set('trust proxy', 'loopback');
  // whitelist + forbidNonWhitelisted + transform; 400s list messages per field (src/common/validation.ts).
  app.useGlobalPipes(createValidationPipe());
  // OpenAPI page at /api/docs and JSON at /api/docs-json, generated from the controllers and DTOs.
  setupOpenApi(app, app.get(ConfigService<AppConfig, true>).get('version', { infer: true }));
  // 503 instead of 500 while the database is unreachable. It matches only connection failures, so
  // other global filters keep every other error whatever the registration order (common/database-unavailable.filter.ts).
  app.useGlobalFilters(new DatabaseUnavailableFilter());
  app.enableShutdownHooks();
  return app;
}
