import { type DynamicModule, type MiddlewareConsumer, Module, type NestModule } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';
import { MikroOrmModule } from '@mikro-orm/nestjs';
import { ServeStaticModule } from '@nestjs/serve-static';
import type { AppConfig } from './config/configuration';
import { ormOptions } from './database/mikro-orm.config';
import { HealthModule } from './health/health.module';
import { RequestLoggingMiddleware } from './common/request-logging.middleware';

/** The root module, built from one configuration so tests and extra instances can run side by side. */
@Module({})
export class AppModule implements NestModule {
  static forRoot(config: AppConfig): DynamicModule {
    const staticSite = config.staticDir
      ? // The built single-page app, served from the same origin as the API.
        [ServeStaticModule.forRoot({ rootPath: config.staticDir, exclude: ['/api/{*path}'] })]
      : [];
    return {
      module: AppModule,
      imports: [
        ConfigModule.forRoot({ isGlobal: true, ignoreEnvFile: true, load: [() => config] }),
        MikroOrmModule.forRoot({ ...ormOptions(config.database), registerRequestContext: true }),
        ...staticSite,
        HealthModule,
      ],
    };
  }

  configure(consumer: MiddlewareConsumer): void {
    consumer.apply(RequestLoggingMiddleware).forRoutes('{*path}');
  }
}
