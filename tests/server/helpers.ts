import { randomUUID } from 'node:crypto';
import type { Express } from 'express';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { afterAll, beforeAll } from 'vitest';
import type { Role } from '../../shared/api/roles.ts';
import { createApp } from '../../server/app.ts';
import { readConfig } from '../../server/config.ts';
import { createDataSource } from '../../server/data-source.ts';
import { hashPassword } from '../../server/modules/auth/password.ts';
import { User } from '../../server/modules/users/user.entity.ts';

export const TEST_PASSWORD = 'correct horse battery';

export interface TestContext {
  ds: DataSource;
  app: Express;
}

/** One DataSource and app per test file, on the throwaway database that scripts/test.ts started. */
export function useTestApp(): TestContext {
  const ctx = {} as TestContext;
  beforeAll(async () => {
    ctx.ds = createDataSource(readConfig());
    await ctx.ds.initialize();
    ctx.app = createApp({ dataSource: ctx.ds });
  });
  afterAll(async () => {
    await ctx.ds?.destroy();
  });
  return ctx;
}

let hashed: Promise<string> | null = null;

/** Creates a user of the role with a unique e-mail; each test makes its own rows. */
export async function makeUser(ds: DataSource, role: Role, overrides: Partial<User> = {}): Promise<User> {
  hashed ??= hashPassword(TEST_PASSWORD);
  const repo = ds.getRepository(User);
  return repo.save(
    repo.create({
      email: `${role}-${randomUUID().slice(0, 8)}@example.test`,
      name: `Test ${role}`,
      role,
      passwordHash: await hashed,
      active: true,
      ...overrides,
    }),
  );
}

export type Agent = ReturnType<typeof request.agent> & { csrf: string };

/** A supertest agent holding a session cookie and the CSRF token of that session. */
export async function agentFor(app: Express, user?: User): Promise<Agent> {
  const agent = request.agent(app) as Agent;
  const res = await agent.get('/api/auth/csrf').expect(200);
  agent.csrf = res.body.csrfToken;
  if (user) {
    await agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email: user.email, password: TEST_PASSWORD }).expect(200);
  }
  return agent;
}

/** Signs in a fresh user of the role and returns the agent. */
export async function signedIn(ctx: TestContext, role: Role): Promise<{ agent: Agent; user: User }> {
  const user = await makeUser(ctx.ds, role);
  return { agent: await agentFor(ctx.app, user), user };
}
