import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RequestMethod } from '@nestjs/common';
import { METHOD_METADATA, PATH_METADATA } from '@nestjs/common/constants';
import { MetadataScanner, ModulesContainer, Reflector } from '@nestjs/core';
import { IS_PUBLIC_KEY } from '../src/common/public.decorator';
import { call } from './http';
import { startTestApp, type TestApp } from './test-app';

/**
 * Every API route declares who may call it. Public routes must be listed here on purpose; every
 * other route must refuse an anonymous caller with 401 before doing anything.
 */
const DELIBERATELY_PUBLIC = new Set([
  'GET /health',
  'GET /dev/mailbox',
  'DELETE /dev/mailbox',
  'POST /auth/register',
  'POST /auth/sign-in',
  'POST /auth/refresh',
  'POST /auth/sign-out',
  'POST /auth/forgot-password',
  'GET /auth/reset-password/:token',
  'POST /auth/reset-password',
  'GET /invitations/:token',
  'POST /invitations/:token/register',
  'GET /view/:token',
  'GET /view/:token/events',
]);

interface RouteInfo {
  key: string;
  method: string;
  path: string;
  isPublic: boolean;
}

function listRoutes(server: TestApp): RouteInfo[] {
  const modules = server.app.get(ModulesContainer);
  const scanner = new MetadataScanner();
  const reflector = server.app.get(Reflector);
  const routes: RouteInfo[] = [];
  const controllers = [...modules.values()].flatMap((module) => [...module.controllers.values()]);
  for (const wrapper of controllers) {
    const { instance, metatype } = wrapper;
    if (!instance || !metatype) continue;
    const base = [reflector.get<string | string[]>(PATH_METADATA, metatype) ?? ''].flat()[0];
    const prototype = Object.getPrototypeOf(instance) as Record<string, unknown>;
    for (const name of scanner.getAllMethodNames(prototype)) {
      const handler = prototype[name] as (...args: unknown[]) => unknown;
      const sub = reflector.get<string | string[] | undefined>(PATH_METADATA, handler);
      const method = reflector.get<RequestMethod | undefined>(METHOD_METADATA, handler);
      if (sub === undefined || method === undefined) continue;
      const path = `/${[base, [sub].flat()[0]].filter((p) => p && p !== '/').join('/')}`.replace(/\/+/g, '/');
      const verb = RequestMethod[method];
      const isPublic = !!reflector.getAllAndOverride<boolean>(IS_PUBLIC_KEY, [handler, metatype]);
      routes.push({ key: `${verb} ${path}`, method: verb, path, isPublic });
    }
  }
  return routes;
}

describe('route access declarations', () => {
  let server: TestApp;
  let routes: RouteInfo[];
  beforeAll(async () => {
    server = await startTestApp();
    routes = listRoutes(server);
  });
  afterAll(async () => {
    await server.close();
  });

  it('finds the application’s routes', () => {
    expect(routes.length).toBeGreaterThan(20);
    expect(routes.map((r) => r.key)).toContain('GET /teams/:teamId/members');
  });

  it('marks exactly the deliberately public routes @Public()', () => {
    const publicRoutes = routes.filter((r) => r.isPublic).map((r) => r.key).sort();
    expect(publicRoutes).toEqual(publicRoutes.filter((k) => DELIBERATELY_PUBLIC.has(k)));
  });

  it('answers 401 not_signed_in to an anonymous caller on every other route', async () => {
    const failures: string[] = [];
    for (const route of routes.filter((r) => !r.isPublic)) {
      const path = route.path.replace(/:(\w+)/g, () => crypto.randomUUID());
      const res = await call(server, route.method, path, route.method === 'GET' || route.method === 'DELETE' ? {} : { body: {} });
      if (res.status !== 401 || res.body?.code !== 'not_signed_in') failures.push(`${route.key} → ${res.status}`);
    }
    expect(failures).toEqual([]);
  });
});
