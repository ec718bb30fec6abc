import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { Lot } from '../../server/modules/lots/lot.entity.ts';
import { DEFAULT_MAPPING, DEFAULT_UNITS, makeBenchLot, testerCsv, type BenchFixture } from './bench-fixtures.ts';
import { signedIn, useTestApp, type Agent } from './helpers.ts';

const ctx = useTestApp();

async function measure(agent: Agent, lotId: number, hfes: number[]) {
  const s = await agent.post(`/api/lots/${lotId}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument: 'Tester', ambientC: 25, mode: 'sample' }).expect(201);
  await agent
    .post(`/api/lots/${lotId}/measurements/import`)
    .set('x-csrf-token', agent.csrf)
    .field('sessionId', String(s.body.id))
    .field('mapping', JSON.stringify(DEFAULT_MAPPING))
    .field('units', JSON.stringify(DEFAULT_UNITS))
    .attach('file', Buffer.from(testerCsv(hfes.map((h, i) => [i + 1, h, 0.65]))), 't.csv')
    .expect(201);
  return s.body.id as number;
}

const propose = (agent: Agent, lotId: number, body: object) => agent.post(`/api/lots/${lotId}/disposition`).set('x-csrf-token', agent.csrf).send(body);
const sign = (agent: Agent, lotId: number, body: object) => agent.post(`/api/lots/${lotId}/disposition/sign`).set('x-csrf-token', agent.csrf).send(body);

describe('disposition: recommendation', () => {
  // Lot of 10, level II, AQL 1.0: B → arrow to E (n 13) ≥ 10, so 100 % with Ac 0 / Re 1 (ISO 2859-1 Table 2-A).
  it('with the sample incomplete recommends nothing yet and says how many parts are missing', async () => {
    const f = await makeBenchLot(ctx.ds, { quantity: 10 });
    const { agent } = await signedIn(ctx, 'inspector');
    await measure(agent, f.lot.id, [150, 160, 170]);
    const res = await agent.get(`/api/lots/${f.lot.id}/disposition`).expect(200);
    expect(res.body.recommendation).toMatchObject({ decision: 'incomplete', measured: 3 });
    expect(res.body.recommendation.reason).toMatch(/7 still to measure/);
  });

  it('with d ≤ Ac recommends accept; with d ≥ Re recommends reject', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    const good = await makeBenchLot(ctx.ds, { quantity: 10 });
    await measure(agent, good.lot.id, Array.from({ length: 10 }, (_, i) => 150 + i));
    const a = await agent.get(`/api/lots/${good.lot.id}/disposition`).expect(200);
    expect(a.body.recommendation).toMatchObject({ decision: 'accept', defects: 0 });
    const bad = await makeBenchLot(ctx.ds, { quantity: 10 });
    await measure(agent, bad.lot.id, [...Array.from({ length: 9 }, (_, i) => 150 + i), 90]);
    const r = await agent.get(`/api/lots/${bad.lot.id}/disposition`).expect(200);
    expect(r.body.recommendation).toMatchObject({ decision: 'reject', defects: 1 });
    expect(r.body.recommendation.reason).toMatch(/Ac 0, Re 1/);
  });

  it('for a variables part type decides by the s-method on hFE (Q ≥ k)', async () => {
    // Letter F, n 10, AQL 1.0 → k 1.72 (Z1.9 Table B-1, reference.md §2 [from memory]).
    const f = await makeBenchLot(ctx.ds, { quantity: 500, part: { samplingMethod: 'variables', hfeMin: 100, hfeMax: 300 } });
    const { agent } = await signedIn(ctx, 'inspector');
    await measure(agent, f.lot.id, [195, 198, 200, 202, 205, 199, 201, 197, 203, 200]);
    const res = await agent.get(`/api/lots/${f.lot.id}/disposition`).expect(200);
    expect(res.body.recommendation.decision).toBe('accept');
    expect(res.body.recommendation.sMethod.k).toBe(1.72);
    expect(res.body.recommendation.sMethod.qL).toBeGreaterThan(1.72);
  });
});

describe('disposition: propose, sign, lock', () => {
  async function proposedLot(): Promise<{ f: BenchFixture; inspector: Agent; qe: Agent; qeName: string }> {
    const f = await makeBenchLot(ctx.ds, { quantity: 10 });
    const { agent: inspector } = await signedIn(ctx, 'inspector');
    const { agent: qe, user } = await signedIn(ctx, 'quality');
    await measure(inspector, f.lot.id, Array.from({ length: 10 }, (_, i) => 150 + i));
    await propose(inspector, f.lot.id, { decision: 'accept', reason: 'All ten parts inside the limits.' }).expect(200);
    return { f, inspector, qe, qeName: user.name };
  }

  it('an inspector proposes; the lot awaits signature and the proposal is audited', async () => {
    const { f } = await proposedLot();
    expect((await ctx.ds.getRepository(Lot).findOneByOrFail({ id: f.lot.id })).status).toBe('awaiting-signature');
    const audit = await ctx.ds.getRepository(AuditEntry).findOneByOrFail({ entityId: String(f.lot.id), action: 'disposition.propose' });
    expect(audit.after).toMatchObject({ proposedDecision: 'accept', recommended: 'accept', status: 'awaiting-signature' });
  });

  it('a quality engineer signs accept: lot accepted, sessions closed, disposition locked, switching advanced, all audited', async () => {
    const { f, qe, qeName } = await proposedLot();
    const res = await sign(qe, f.lot.id, { decision: 'accept', reason: 'Sample clean; accept.' }).expect(200);
    expect(res.body).toMatchObject({ locked: true, lotStatus: 'accepted', signature: { decision: 'accept', mrbAction: null, by: { name: qeName } } });
    expect((await ctx.ds.getRepository(Lot).findOneByOrFail({ id: f.lot.id })).status).toBe('accepted');
    const open = (await ctx.ds.query('SELECT count(*)::int AS n FROM measurement_session WHERE lot_id = $1 AND closed_at IS NULL', [f.lot.id])) as { n: number }[];
    expect(open[0].n).toBe(0);
    const actions = (await ctx.ds.getRepository(AuditEntry).find({ where: { entityId: String(f.lot.id) } })).map((a) => a.action);
    expect(actions).toEqual(expect.arrayContaining(['disposition.propose', 'disposition.sign']));
    const sw = await qe.get(`/api/switching/${f.supplier.id}/${f.partType.id}`).expect(200);
    expect(sw.body).toMatchObject({ severity: 'normal', recent: ['accepted'] });
  });

  it('once signed the disposition is locked: no second signature, no new proposal, no new readings, and the database refuses edits', async () => {
    const { f, inspector, qe } = await proposedLot();
    await sign(qe, f.lot.id, { decision: 'accept', reason: 'Sample clean; accept.' }).expect(200);
    await sign(qe, f.lot.id, { decision: 'reject', reason: 'Changed my mind.' }).expect(409);
    await propose(inspector, f.lot.id, { decision: 'reject', reason: 'Another look.' }).expect(409);
    const s = await inspector.post(`/api/lots/${f.lot.id}/sessions`).set('x-csrf-token', inspector.csrf).send({ instrument: 'Tester', ambientC: 25, mode: 'sample' });
    expect(s.status).toBe(409);
    await expect(ctx.ds.query(`UPDATE disposition SET decision = 'reject' WHERE lot_id = $1`, [f.lot.id])).rejects.toThrow(/locked/);
  });

  it('MRB without its action answers 400 naming mrbAction; with "return to supplier" the lot goes to MRB', async () => {
    const { f, qe } = await proposedLot();
    const bad = await sign(qe, f.lot.id, { decision: 'mrb', reason: 'Gain spread suspicious.' }).expect(400);
    expect(bad.body.errors[0].field).toBe('mrbAction');
    const res = await sign(qe, f.lot.id, { decision: 'mrb', mrbAction: 'return-to-supplier', reason: 'Gain spread suspicious.' }).expect(200);
    expect(res.body.signature).toMatchObject({ decision: 'mrb', mrbAction: 'return-to-supplier' });
    expect((await ctx.ds.getRepository(Lot).findOneByOrFail({ id: f.lot.id })).status).toBe('mrb');
  });

  it('signing before any proposal answers 409; a missing reason answers 400 naming reason', async () => {
    const f = await makeBenchLot(ctx.ds, { quantity: 10 });
    const { agent: qe } = await signedIn(ctx, 'quality');
    await sign(qe, f.lot.id, { decision: 'reject', reason: 'No proposal yet.' }).expect(409);
    const res = await propose(qe, f.lot.id, { decision: 'reject' }).expect(400);
    expect(res.body.errors[0].field).toBe('reason');
  });

  it('the inspection report is a PDF naming the plan, its source, the results and who signed', async () => {
    const { f, qe, qeName } = await proposedLot();
    await sign(qe, f.lot.id, { decision: 'accept', reason: 'Sample clean; accept.' }).expect(200);
    const res = await qe.get(`/api/lots/${f.lot.id}/report.pdf`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const pdf = res.body as Buffer;
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    const file = path.join(os.tmpdir(), `bw-report-${f.lot.id}.pdf`);
    fs.writeFileSync(file, pdf);
    const text = spawnSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
    if (text.status === 0) {
      expect(text.stdout).toContain(f.lot.code);
      expect(text.stdout).toContain('ISO 2859-1');
      expect(text.stdout).toContain('ACCEPT');
      expect(text.stdout).toContain(`Signed by ${qeName}`);
      expect(text.stdout).toMatch(/10 parts measured/);
    }
  });
});
