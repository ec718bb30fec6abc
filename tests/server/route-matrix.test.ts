/**
 * Route × role matrix built from the server's own router: every API route is found by walking
 * Express's router stack, so a new route cannot be left out. For each route:
 *  - without a session it answers 401 (except the few public routes),
 *  - each role that its requireRole guards exclude gets 403,
 *  - each role they allow is not turned away (no 401/403 from the guard) and gets no 5xx,
 *  - every state-changing route behind sign-in has a role guard.
 */
import type { Express, RequestHandler } from 'express';
import { describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../../shared/api/roles.ts';
import { requireAuth } from '../../server/http/guards.ts';
import { agentFor, makeUser, useTestApp, type Agent } from './helpers.ts';

interface Layer {
  route?: { path: string | string[]; methods: Record<string, boolean>; stack: Layer[] };
  handle: RequestHandler & { stack?: Layer[]; allowedRoles?: ReadonlySet<Role> };
  rawPath?: string | string[];
  slash?: boolean;
}

interface RouteInfo {
  method: string;
  path: string;
  needsAuth: boolean;
  allowed: Set<Role>;
  guarded: boolean;
}

function intersect(sets: ReadonlySet<Role>[]): Set<Role> {
  let out = new Set<Role>(ROLES);
  for (const s of sets) out = new Set([...out].filter((r) => s.has(r)));
  return out;
}

function walk(stack: Layer[], prefix: string, inheritedGuards: ReadonlySet<Role>[], inheritedAuth: boolean, out: RouteInfo[]) {
  const guards = [...inheritedGuards];
  let auth = inheritedAuth;
  for (const layer of stack) {
    if (layer.handle === requireAuth) {
      auth = true;
      continue;
    }
    if (layer.handle.allowedRoles && !layer.route) {
      guards.push(layer.handle.allowedRoles);
      continue;
    }
    const raw = Array.isArray(layer.rawPath) ? layer.rawPath[0] : layer.rawPath;
    if (layer.route) {
      const path = Array.isArray(layer.route.path) ? layer.route.path[0] : layer.route.path;
      const routeGuards = layer.route.stack.map((l) => l.handle.allowedRoles).filter((g): g is ReadonlySet<Role> => Boolean(g));
      for (const method of Object.keys(layer.route.methods)) {
        if (method === '_all') continue;
        const all = [...guards, ...routeGuards];
        out.push({ method: method.toUpperCase(), path: (prefix + path).replace(/(.)\/$/, '$1'), needsAuth: auth, allowed: intersect(all), guarded: all.length > 0 });
      }
    } else if (layer.handle.stack) {
      walk(layer.handle.stack, prefix + (raw && raw !== '/' ? raw : ''), guards, auth, out);
    }
  }
}

export function collectRoutes(app: Express): RouteInfo[] {
  const out: RouteInfo[] = [];
  const root = (app as unknown as { router: { stack: Layer[] } }).router;
  walk(root.stack, '', [], false, out);
  return out.filter((r) => r.path.startsWith('/api/'));
}

/** POST routes that compute an answer and change nothing (the request carries a body). */
const READ_ONLY_POSTS = new Set(['POST /api/labels/parse', 'POST /api/pairing/preview', 'POST /api/bias/evaluate', 'POST /api/bias/fit-for-use']);

function concrete(path: string): string {
  return path.replace(/:(\w+)/g, (_m, name: string) => (/id$/i.test(name) || name === 'version' || name === 'index' ? '1' : 'x'));
}

const ctx = useTestApp();

describe('route × role matrix', () => {
  it('finds the API routes from the router itself', () => {
    const routes = collectRoutes(ctx.app);
    expect(routes.length).toBeGreaterThan(8);
    expect(routes.some((r) => r.method === 'POST' && r.path === '/api/users')).toBe(true);
  });

  it('every state-changing route behind sign-in checks the role', () => {
    const unguarded = collectRoutes(ctx.app)
      .filter((r) => r.needsAuth && r.method !== 'GET' && !r.guarded && !READ_ONLY_POSTS.has(`${r.method} ${r.path}`))
      .map((r) => `${r.method} ${r.path}`);
    expect(unguarded).toEqual([]);
  });

  it('without a session, every route behind sign-in answers 401', async () => {
    const anon = await agentFor(ctx.app);
    const failures: string[] = [];
    for (const r of collectRoutes(ctx.app).filter((x) => x.needsAuth)) {
      const res = await send(anon, r);
      if (res.status !== 401) failures.push(`${r.method} ${r.path} → ${res.status}`);
    }
    expect(failures).toEqual([]);
  });

  it('each role gets 403 exactly where its guards exclude it, and never a 5xx where allowed', async () => {
    const agents = {} as Record<Role, Agent>;
    for (const role of ROLES) agents[role] = await agentFor(ctx.app, await makeUser(ctx.ds, role));
    const failures: string[] = [];
    for (const r of collectRoutes(ctx.app).filter((x) => x.needsAuth)) {
      for (const role of ROLES) {
        const res = await send(agents[role], r);
        const forbiddenByGuard = res.status === 403 && res.body?.code === 'forbidden';
        if (!r.allowed.has(role) && !forbiddenByGuard) failures.push(`${role} ${r.method} ${r.path} → ${res.status} (expected 403)`);
        if (r.allowed.has(role) && (res.status === 401 || forbiddenByGuard || res.status >= 500)) {
          failures.push(`${role} ${r.method} ${r.path} → ${res.status} ${res.body?.detail ?? ''}`);
        }
      }
    }
    expect(failures).toEqual([]);
  }, 120_000);
});

function send(agent: Agent, r: RouteInfo) {
  const url = concrete(r.path);
  const m = r.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  const req = agent[m](url);
  if (r.method === 'GET') return req;
  return req.set('x-csrf-token', agent.csrf).send({});
}
