import { NestFactory } from '@nestjs/core';
import { EntityManager } from '@mikro-orm/postgresql';
import { loadConfig, type AppConfig } from '../config/configuration';
import { AppModule } from '../app.module';
import { DemoSeeder } from '../demo/demo.seeder';

/**
 * Seeds the demo scenario once and reports what it did. Runs inside the application's own module graph,
 * so the demo maps go through the same validation and versioning as maps made in the app.
 */
export async function seedDemoData(db: AppConfig['database'], options: { reset?: boolean } = {}): Promise<string> {
  const config: AppConfig = { ...loadConfig(), database: db, staticDir: null };
  const app = await NestFactory.createApplicationContext(AppModule.forRoot(config), { logger: false, abortOnError: false });
  try {
    return await app.get(DemoSeeder).run(app.get(EntityManager), options);
  } finally {
    await app.close();
  }
}
