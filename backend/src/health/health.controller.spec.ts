import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { HealthResponse } from '@fieldbound/shared';
import { loadConfig } from '../config/configuration';
import { startTestApp, type TestApp } from '../../test/test-app';

const rootPackage = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../../package.json'), 'utf8')) as { version: string };

describe('GET /api/health', () => {
  let server: TestApp;
  beforeAll(async () => {
    server = await startTestApp();
  });
  afterAll(async () => {
    await server.close();
  });

  it('answers 200 with the package version and the PostgreSQL server version from a real query', async () => {
    const res = await fetch(`${server.baseUrl}/health`);
    expect(res.status).toBe(200);
    const body = (await res.json()) as HealthResponse;
    expect(body.status).toBe('ok');
    expect(body.version).toBe(rootPackage.version);
    expect(body.database.status).toBe('up');
    expect(body.database.serverVersion).toMatch(/^\d+\.\d+/);
    expect(body.database.latencyMs).toBeGreaterThanOrEqual(0);
  });

  it('sets helmet security headers', async () => {
    const res = await fetch(`${server.baseUrl}/health`);
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    expect(res.headers.get('content-security-policy')).toContain("default-src 'self'");
  });
});

describe('GET /api/health with the database unreachable', () => {
  it('answers 503 with database status down instead of failing the request', async () => {
    const config = loadConfig();
    // Port 1 on loopback: nothing listens there, so connections are refused at once.
    const server = await startTestApp({ database: { ...config.database, port: 1 } });
    try {
      const res = await fetch(`${server.baseUrl}/health`);
      expect(res.status).toBe(503);
      const body = (await res.json()) as HealthResponse;
      expect(body.status).toBe('degraded');
      expect(body.database).toEqual({ status: 'down', latencyMs: null, serverVersion: null });
    } finally {
      await server.close();
    }
  });
});
