import type { INestApplication } from '@nestjs/common';
import { createApp } from '../src/app.factory';
import { loadConfig, type AppConfig } from '../src/config/configuration';

export interface TestApp {
  app: INestApplication;
  baseUrl: string;
  close(): Promise<void>;
}

/** The real application on an ephemeral loopback port, against the test database. */
export async function startTestApp(overrides: Partial<AppConfig> = {}): Promise<TestApp> {
  const config: AppConfig = { ...loadConfig(), staticDir: null, port: 0, ...overrides };
  const app = await createApp({ logs: 'silent', config });
  await app.listen(0, '127.0.0.1');
  const address = app.getHttpServer().address() as { port: number };
  return { app, baseUrl: `http://127.0.0.1:${address.port}/api`, close: () => app.close() };
}
