/**
 * The calculation endpoints of Pairing: the loose-parts preview and the bias check. Contract
 * field names are fixed; bad input is a 400 naming the field; any signed-in role may call them.
 */
import { describe, expect, it } from 'vitest';
import { ROLES } from '../../shared/api/roles.ts';
import type { FitForUseResponse } from '../../shared/api/bias.ts';
import { agentFor, signedIn, useTestApp, type Agent } from './helpers.ts';
import { makePairingPartType, makeStockLot } from './pairing-fixtures.ts';

const ctx = useTestApp();
const post = (a: Agent, url: string, body: unknown) => a.post(url).set('x-csrf-token', a.csrf).send(body as object);

const PREVIEW = {
  parts: [
    { id: 'Q1', polarity: 'NPN', hfe: 200, vbeMv: 652.0 },
    { id: 'Q2', polarity: 'NPN', hfe: 204, vbeMv: 652.4 },
    { id: 'Q3', polarity: 'NPN', hfe: 300, vbeMv: 660.0 },
    { id: 'Q4', polarity: 'NPN', hfe: 150, vbeMv: 640.0 },
  ],
  hfeTolerancePct: 5,
  vbeToleranceMv: 1,
  setSize: 2,
  mode: 'same',
};

describe('POST /api/pairing/preview', () => {
  it('answers the matched sets with partIds, hfeSpreadPct and vbeSpreadMv, and the unmatched ids', async () => {
    const { agent } = await signedIn(ctx, 'assembler');
    const res = await post(agent, '/api/pairing/preview', PREVIEW);
    expect(res.status).toBe(200);
    expect(res.body.sets).toHaveLength(1);
    const [set] = res.body.sets;
    expect(set.partIds).toEqual(['Q1', 'Q2']);
    // |200 − 204| / min(200, 204) = 2 %; |652.0 − 652.4| = 0.4 mV.
    expect(set.hfeSpreadPct).toBeCloseTo(2, 9);
    expect(set.vbeSpreadMv).toBeCloseTo(0.4, 9);
    // Mirror ratio exp(0.4/25.693) = 1.01569 (reference.md §5, derived); offset = ΔVbe.
    expect(set.meaning.mirrorRatio).toBeCloseTo(1.01569, 4);
    expect(set.meaning.offsetMv).toBeCloseTo(0.4, 9);
    expect(set.meaning.hfeRatio).toBeCloseTo(200 / 204, 9);
    expect(res.body.unmatched.sort()).toEqual(['Q3', 'Q4']);
    expect(res.body.optimal).toBe(true);
    expect(typeof res.body.method).toBe('string');
  });

  it('echoes numeric ids as numbers, pairs complementary NPN/PNP by |Vbe|, and answers empty sets for no parts', async () => {
    const { agent } = await signedIn(ctx, 'assembler');
    const res = await post(agent, '/api/pairing/preview', {
      parts: [
        { id: 1, polarity: 'NPN', hfe: 100, vbeMv: 640 },
        { id: 2, polarity: 'PNP', hfe: 105, vbeMv: -641 },
        { id: 3, polarity: 'NPN', hfe: 101, vbeMv: 640.5 },
      ],
      hfeTolerancePct: 10,
      vbeToleranceMv: 2,
      setSize: 2,
      mode: 'complementary',
    });
    expect(res.status).toBe(200);
    expect(res.body.sets).toHaveLength(1);
    expect(res.body.sets[0].partIds[1]).toBe(2);
    expect(typeof res.body.sets[0].partIds[0]).toBe('number');
    expect(res.body.unmatched).toHaveLength(1);
    const empty = await post(agent, '/api/pairing/preview', { ...PREVIEW, parts: [] });
    expect(empty.status).toBe(200);
    expect(empty.body).toMatchObject({ sets: [], unmatched: [] });
  });

  it.each([
    ['parts missing', 'parts', { ...PREVIEW, parts: undefined }],
    ['a negative hFE', 'parts[1].hfe', { ...PREVIEW, parts: [PREVIEW.parts[0], { ...PREVIEW.parts[1], hfe: -5 }] }],
    ['an unknown polarity', 'parts[0].polarity', { ...PREVIEW, parts: [{ ...PREVIEW.parts[0], polarity: 'FET' }] }],
    ['Vbe as text', 'parts[0].vbeMv', { ...PREVIEW, parts: [{ ...PREVIEW.parts[0], vbeMv: '652' }] }],
    ['a part without id', 'parts[0].id', { ...PREVIEW, parts: [{ polarity: 'NPN', hfe: 100, vbeMv: 650 }] }],
    ['the same id twice', 'parts[1].id', { ...PREVIEW, parts: [PREVIEW.parts[0], { ...PREVIEW.parts[1], id: 'Q1' }] }],
    ['set size 3', 'setSize', { ...PREVIEW, setSize: 3 }],
    ['complementary quads', 'setSize', { ...PREVIEW, setSize: 4, mode: 'complementary' }],
    ['an unknown mode', 'mode', { ...PREVIEW, mode: 'mixed' }],
    ['a negative hFE tolerance', 'hfeTolerancePct', { ...PREVIEW, hfeTolerancePct: -1 }],
    ['the Vbe tolerance missing', 'vbeToleranceMv', { ...PREVIEW, vbeToleranceMv: undefined }],
    ['an unknown field', 'temperature', { ...PREVIEW, temperature: 25 }],
  ])('with %s, answers 400 naming %s', async (_what, field, body) => {
    const { agent } = await signedIn(ctx, 'assembler');
    const res = await post(agent, '/api/pairing/preview', body);
    expect(res.status).toBe(400);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(res.body.errors.map((e: { field: string }) => e.field)).toContain(field);
  });

  it.each(ROLES)('a signed-in %s may call it (it changes nothing)', async (role) => {
    const { agent } = await signedIn(ctx, role);
    expect((await post(agent, '/api/pairing/preview', PREVIEW)).status).toBe(200);
  });

  it('without a session answers 401', async () => {
    const anon = await agentFor(ctx.app);
    expect((await post(anon, '/api/pairing/preview', PREVIEW)).status).toBe(401);
  });
});

/**
 * Check values derived by hand from the divider-bias formulas of reference.md §5:
 * VCC 10 V, R1 10 kΩ, R2 2.2 kΩ, RE 1 kΩ, RC 3.3 kΩ, β 100, VBE 0.7 V →
 * VTH = 10·2.2/12.2 = 1.803279 V, RTH = 10·2.2/12.2 kΩ = 1803.279 Ω,
 * IB = (1.803279 − 0.7)/(1803.279 + 101·1000) = 10.7320 µA, IC = 1.07320 mA,
 * VE = 101·IB·1000 = 1.08393 V, VB = 1.78393 V, VC = 10 − 3300·IC = 6.45843 V, VCE = 5.37450 V.
 */
const STAGE = { vcc: 10, r1: 10_000, r2: 2_200, re: 1_000, rc: 3_300 };

describe('POST /api/bias/evaluate', () => {
  it('answers vth, rth, ib, ic, vb, ve, vc, vce and saturated in SI units', async () => {
    const { agent } = await signedIn(ctx, 'buyer');
    const res = await post(agent, '/api/bias/evaluate', { ...STAGE, hfe: 100, vbeV: 0.7 });
    expect(res.status).toBe(200);
    const b = res.body;
    expect(b.vth).toBeCloseTo(1.803279, 5);
    expect(b.rth).toBeCloseTo(1803.279, 2);
    expect(b.ib).toBeCloseTo(10.7320e-6, 9);
    expect(b.ic).toBeCloseTo(1.07320e-3, 7);
    expect(b.ve).toBeCloseTo(1.08393, 4);
    expect(b.vb).toBeCloseTo(1.78393, 4);
    expect(b.vc).toBeCloseTo(6.45843, 4);
    expect(b.vce).toBeCloseTo(5.3745, 3);
    expect(b.saturated).toBe(false);
  });

  it('flags saturation when RC would pull the collector below the emitter', async () => {
    const { agent } = await signedIn(ctx, 'assembler');
    const res = await post(agent, '/api/bias/evaluate', { ...STAGE, rc: 10_000, hfe: 100, vbeV: 0.7 });
    expect(res.status).toBe(200);
    expect(res.body.saturated).toBe(true);
    expect(res.body.vce).toBeLessThan(0.25);
  });

  it.each([
    ['vbeV missing', 'vbeV', { ...STAGE, hfe: 100 }],
    ['Vbe given in mV', 'vbeV', { ...STAGE, hfe: 100, vbeV: 650 }],
    ['r1 zero', 'r1', { ...STAGE, r1: 0, hfe: 100, vbeV: 0.65 }],
    ['a negative RE', 're', { ...STAGE, re: -1, hfe: 100, vbeV: 0.65 }],
    ['hFE as text', 'hfe', { ...STAGE, hfe: 'high', vbeV: 0.65 }],
    ['an unknown field', 'beta', { ...STAGE, hfe: 100, vbeV: 0.65, beta: 100 }],
  ])('with %s, answers 400 naming %s', async (_what, field, body) => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await post(agent, '/api/bias/evaluate', body);
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { field: string }) => e.field)).toContain(field);
  });
});

describe('POST /api/bias/fit-for-use', () => {
  it('runs the stage against a lot: spreads, share saturating, histograms of IC and VCE over every measured part', async () => {
    const pt = await makePairingPartType(ctx.ds);
    // hFE 50…500: at RC 6.8 kΩ the high-gain parts saturate.
    const hfes = [50, 80, 100, 150, 200, 250, 300, 350, 400, 500];
    const lot = await makeStockLot(ctx.ds, pt, hfes.map((h, i) => ({ hfe: h, vbeMv: 640 + i })));
    const { agent } = await signedIn(ctx, 'assembler');
    const stage = { vcc: 12, r1: 470_000, r2: 47_000, re: 0, rc: 6_800 };
    const res = await post(agent, '/api/bias/fit-for-use', { lotId: lot.lotId, stage });
    expect(res.status).toBe(200);
    const f = res.body as FitForUseResponse;
    expect(f.n).toBe(10);
    expect(f.source).toMatchObject({ kind: 'lot', id: lot.lotId, partNumber: pt.partNumber });
    // Each part's own point decides: count the saturated ones from /evaluate.
    let sat = 0;
    for (const [i, h] of hfes.entries()) {
      const one = await post(agent, '/api/bias/evaluate', { ...stage, hfe: h, vbeV: (640 + i) / 1000 });
      if (one.body.saturated) sat++;
    }
    expect(sat).toBeGreaterThan(0);
    expect(sat).toBeLessThan(10);
    expect(f.saturatedCount).toBe(sat);
    expect(f.saturatedShare).toBeCloseTo(sat / 10, 12);
    expect(f.histograms.ic.counts.reduce((a, b) => a + b, 0)).toBe(10);
    expect(f.histograms.vce.counts.reduce((a, b) => a + b, 0)).toBe(10);
    expect(f.histograms.vce.edges.length).toBe(f.histograms.vce.counts.length + 1);
    expect(f.spreads.ic.min).toBeLessThan(f.spreads.ic.max);
    expect(f.spreads.vce.min).toBeLessThan(0.25);
    expect(f.inputs.hfe.min).toBe(50);
    expect(f.inputs.hfe.max).toBe(500);
    expect(f.saturationVceV).toBe(0.2);
    expect(f.typical.ic).toBeGreaterThan(0);
  });

  it('runs against a part type over all of its lots', async () => {
    const pt = await makePairingPartType(ctx.ds);
    await makeStockLot(ctx.ds, pt, [{ hfe: 100, vbeMv: 650 }]);
    await makeStockLot(ctx.ds, pt, [
      { hfe: 200, vbeMv: 655 },
      { hfe: 210, vbeMv: 656 },
    ]);
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await post(agent, '/api/bias/fit-for-use', { partTypeId: pt.partTypeId, stage: STAGE });
    expect(res.status).toBe(200);
    expect(res.body.n).toBe(3);
    expect(res.body.source).toMatchObject({ kind: 'part-type', lots: 2 });
    const sources = (await agent.get('/api/bias/sources').expect(200)).body as { partTypeId: number; measured: number; lots: unknown[] }[];
    expect(sources.find((s) => s.partTypeId === pt.partTypeId)).toMatchObject({ measured: 3 });
  });

  it('bad input: neither or both sources 400, no such lot 404, a lot without readings 422, stage fields named', async () => {
    const pt = await makePairingPartType(ctx.ds);
    const empty = await makeStockLot(ctx.ds, pt, []);
    const { agent } = await signedIn(ctx, 'assembler');
    const neither = await post(agent, '/api/bias/fit-for-use', { stage: STAGE });
    expect(neither.status).toBe(400);
    expect(neither.body.errors[0].field).toBe('lotId');
    const both = await post(agent, '/api/bias/fit-for-use', { lotId: empty.lotId, partTypeId: pt.partTypeId, stage: STAGE });
    expect(both.status).toBe(400);
    expect((await post(agent, '/api/bias/fit-for-use', { lotId: 99999999, stage: STAGE })).status).toBe(404);
    const none = await post(agent, '/api/bias/fit-for-use', { lotId: empty.lotId, stage: STAGE });
    expect(none.status).toBe(422);
    expect(none.body.errors[0].field).toBe('lotId');
    const noStage = await post(agent, '/api/bias/fit-for-use', { lotId: empty.lotId });
    expect(noStage.status).toBe(400);
    expect(noStage.body.errors[0].field).toBe('stage');
    const badR = await post(agent, '/api/bias/fit-for-use', { lotId: empty.lotId, stage: { ...STAGE, r2: -5 } });
    expect(badR.status).toBe(400);
    expect(badR.body.errors[0].field).toBe('stage.r2');
  });
});
