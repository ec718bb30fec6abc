import { describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../../shared/api/roles.ts';
import { agentFor, makeUser, useTestApp, type Agent } from './helpers.ts';

const ctx = useTestApp();

/** Every route of the Suppliers area; the writes carry a body that passes no validation on purpose. */
const WRITES: [method: 'post' | 'patch', url: string][] = [
  ['post', '/api/drift-alerts/99999999/acknowledge'],
  ['post', '/api/ncrs'],
  ['patch', '/api/ncrs/99999999'],
  ['post', '/api/ncrs/99999999/send'],
  ['post', '/api/ncrs/99999999/answer'],
  ['post', '/api/ncrs/99999999/close'],
  ['post', '/api/order-plans'],
];
const READS = [
  '/api/scorecards',
  '/api/scorecards.csv',
  '/api/scorecards/99999999',
  '/api/drift-alerts',
  '/api/drift-alerts/99999999',
  '/api/ncrs',
  '/api/ncrs/draft?lotId=99999999',
  '/api/ncrs/99999999',
  '/api/ncrs/99999999/report.pdf',
  '/api/ncrs/99999999/answer-document',
  '/api/order-plans/00000000-0000-0000-0000-000000000000',
];

const agents = {} as Record<Role, Agent>;
async function agent(role: Role): Promise<Agent> {
  agents[role] ??= await agentFor(ctx.app, await makeUser(ctx.ds, role));
  return agents[role];
}

describe('Suppliers area roles', () => {
  const outsiders = ROLES.filter((r) => r !== 'buyer' && r !== 'quality');
  expect(outsiders).toEqual(['inspector', 'assembler']);

  describe.each(outsiders)('a %s', (role) => {
    it.each(WRITES)('gets 403 on %s %s', async (method, url) => {
      const a = await agent(role);
      const res = await a[method](url).set('x-csrf-token', a.csrf).send({ note: 'x' });
      expect(res.status).toBe(403);
      expect(res.body.code).toBe('forbidden');
    });
    it.each(READS)('gets 403 on GET %s', async (url) => {
      const res = await (await agent(role)).get(url);
      expect(res.status).toBe(403);
    });
  });

  describe.each(['buyer', 'quality'] as const)('a %s', (role) => {
    it.each(WRITES)('passes the role check on %s %s (the request then fails on its content)', async (method, url) => {
      const a = await agent(role);
      const res = await a[method](url).set('x-csrf-token', a.csrf).send({});
      expect([400, 404, 409, 422]).toContain(res.status);
    });
    it.each(READS)('passes the role check on GET %s', async (url) => {
      const res = await (await agent(role)).get(url);
      expect(res.status).not.toBe(403);
      expect(res.status).toBeLessThan(500);
    });
  });

  it('without a session every route answers 401', async () => {
    const anon = await agentFor(ctx.app);
    for (const [method, url] of WRITES) expect((await anon[method](url).set('x-csrf-token', anon.csrf).send({})).status).toBe(401);
    for (const url of READS) expect((await anon.get(url)).status).toBe(401);
  });
});
