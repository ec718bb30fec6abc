import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { lockSchemeVersion } from '../../server/modules/catalog/bin-schemes.service.ts';
import { signedIn, useTestApp, type Agent } from './helpers.ts';
import { createPart, createSupplierVia, fields, fourBins, insertLot } from './catalog-helpers.ts';

const ctx = useTestApp();

function postScheme(agent: Agent, partId: number, body: object) {
  return agent.post(`/api/part-types/${partId}/bin-schemes`).set('x-csrf-token', agent.csrf).send(body);
}

describe('POST /api/part-types/:id/bin-schemes', () => {
  it('creates version 1, then 2; the list shows newest first with only the newest current', async () => {
    const { agent, user } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const v1 = await postScheme(agent, part.id, { note: 'first cut', bins: fourBins() });
    expect(v1.status).toBe(201);
    expect(v1.body).toMatchObject({ version: 1, current: true, locked: false, lotCount: 0, note: 'first cut', createdByName: user.name });
    expect(v1.body.bins.map((b: { code: string }) => b.code)).toEqual(['A', 'B', 'C', 'D']);

    const bins2 = fourBins().slice(0, 2).concat([{ code: 'C', label: 'hFE 200–300', hfeMin: 200, hfeMax: 300 }]);
    await postScheme(agent, part.id, { bins: bins2 }).expect(201);

    const list = await agent.get(`/api/part-types/${part.id}/bin-schemes`).expect(200);
    expect(list.body.map((v: { version: number; current: boolean }) => [v.version, v.current])).toEqual([
      [2, true],
      [1, false],
    ]);
    const detail = await agent.get(`/api/part-types/${part.id}`).expect(200);
    expect(detail.body.currentSchemeVersion).toBe(2);

    const entries = await ctx.ds.getRepository(AuditEntry).findBy({ entityType: 'gain-bin-scheme', entityId: String(v1.body.id) });
    expect(entries.map((e) => e.action)).toEqual(['bin-scheme.create']);
    expect(entries[0].after).toMatchObject({ version: 1, partNumber: part.partNumber });
  });

  it('when two bins overlap, answers 400 naming bins[i].hfeMin', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const bins = fourBins();
    bins[2] = { ...bins[2], hfeMin: 190 };
    const res = await postScheme(agent, part.id, { bins }).expect(400);
    expect(res.body.errors).toEqual([{ field: 'bins[2].hfeMin', message: expect.stringMatching(/overlaps the previous bin \("B"\)/) }]);
  });

  it('when a gap is not marked intended, answers 400 naming the later bin; marked, it is accepted', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const bins = fourBins();
    bins[1] = { ...bins[1], hfeMin: 160 };
    const res = await postScheme(agent, part.id, { bins }).expect(400);
    expect(fields(res.body)).toEqual(['bins[1].hfeMin']);
    expect(res.body.errors[0].message).toMatch(/gap from 150 to 160/);
    bins[1] = { ...bins[1], gapBeforeIntended: true };
    await postScheme(agent, part.id, { bins }).expect(201);
  });

  it("when bins reach outside the part's hFE limits, answers 400 naming the bins at both ends", async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const bins = fourBins();
    bins[0] = { ...bins[0], hfeMin: 90 };
    bins[3] = { ...bins[3], hfeMax: 320 };
    const res = await postScheme(agent, part.id, { bins }).expect(400);
    expect(fields(res.body)).toEqual(['bins[0].hfeMin', 'bins[3].hfeMax']);
  });

  it('when a bin misses its code or carries an unknown field, answers 400 naming bins[i].field', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const bins: object[] = fourBins();
    bins[1] = { label: 'no code', hfeMin: 150, hfeMax: 200 };
    bins[2] = { ...fourBins()[2], colour: 'red' };
    const res = await postScheme(agent, part.id, { bins }).expect(400);
    expect(fields(res.body)).toEqual(expect.arrayContaining(['bins[1].code', 'bins[2].colour']));
    expect(res.body.errors.find((e: { field: string }) => e.field === 'bins[2].colour').message).toBe('bins[2].colour is not a known field');
  });

  it('an empty scheme answers 400 naming bins; duplicate codes name the repeated code', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    expect(fields((await postScheme(agent, part.id, { bins: [] }).expect(400)).body)).toEqual(['bins']);
    const bins = fourBins();
    bins[3] = { ...bins[3], code: 'A' };
    expect(fields((await postScheme(agent, part.id, { bins }).expect(400)).body)).toEqual(['bins[3].code']);
  });

  it('an unknown part type answers 404', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    await postScheme(agent, 99999999, { bins: fourBins() }).expect(404);
    await agent.get('/api/part-types/99999999/bin-schemes').expect(404);
  });
});

describe('PUT /api/part-types/:id/bin-schemes/:version', () => {
  it('edits a version no lot uses, replacing its bins and auditing before and after', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const v1 = (await postScheme(agent, part.id, { bins: fourBins() }).expect(201)).body;
    const bins = fourBins().map((b) => ({ ...b, label: `${b.label} (renamed)` }));
    const res = await agent.put(`/api/part-types/${part.id}/bin-schemes/1`).set('x-csrf-token', agent.csrf).send({ note: 'labels', bins }).expect(200);
    expect(res.body).toMatchObject({ id: v1.id, version: 1, current: true, note: 'labels' });
    expect(res.body.bins[0].label).toBe('hFE 100–150 (renamed)');
    const [entry] = await ctx.ds.getRepository(AuditEntry).findBy({ entityType: 'gain-bin-scheme', entityId: String(v1.id), action: 'bin-scheme.update' });
    expect((entry.before as { bins: { label: string }[] }).bins[0].label).toBe('hFE 100–150');
    expect((entry.after as { bins: { label: string }[] }).bins[0].label).toBe('hFE 100–150 (renamed)');
  });

  it('a version that a lot uses answers 409 scheme-locked; saving the bins as a new version works', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const supplier = await createSupplierVia(agent);
    const v1 = (await postScheme(agent, part.id, { bins: fourBins() }).expect(201)).body;
    await insertLot(ctx.ds, { supplierId: supplier.id, partTypeId: part.id, binSchemeId: v1.id });

    const list = await agent.get(`/api/part-types/${part.id}/bin-schemes`).expect(200);
    expect(list.body[0]).toMatchObject({ version: 1, locked: true, lotCount: 1, lockedAt: null });

    const edit = await agent.put(`/api/part-types/${part.id}/bin-schemes/1`).set('x-csrf-token', agent.csrf).send({ bins: fourBins() }).expect(409);
    expect(edit.body.code).toBe('scheme-locked');
    expect(edit.body.detail).toMatch(/1 lot uses it.*new version/);

    const v2 = await postScheme(agent, part.id, { bins: fourBins() }).expect(201);
    expect(v2.body).toMatchObject({ version: 2, current: true, locked: false });
  });

  it('a version locked with lockSchemeVersion answers 409 even before any lot exists', async () => {
    const { agent, user } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const v1 = (await postScheme(agent, part.id, { bins: fourBins() }).expect(201)).body;
    const first = await ctx.ds.transaction((m) => lockSchemeVersion(m, v1.id, { actor: user, reason: 'lot started screening' }));
    const again = await ctx.ds.transaction((m) => lockSchemeVersion(m, v1.id));
    expect([first, again]).toEqual([true, false]);
    const locks = await ctx.ds.getRepository(AuditEntry).findBy({ entityType: 'gain-bin-scheme', entityId: String(v1.id), action: 'bin-scheme.lock' });
    expect(locks).toHaveLength(1);
    expect(locks[0]).toMatchObject({ actorId: user.id, note: 'lot started screening' });

    const list = await agent.get(`/api/part-types/${part.id}/bin-schemes`).expect(200);
    expect(list.body[0]).toMatchObject({ locked: true, lotCount: 0 });
    expect(list.body[0].lockedAt).not.toBeNull();
    const edit = await agent.put(`/api/part-types/${part.id}/bin-schemes/1`).set('x-csrf-token', agent.csrf).send({ bins: fourBins() }).expect(409);
    expect(edit.body.detail).toMatch(/locked on/);
  });

  it('lockSchemeVersion on an unknown scheme throws not found', async () => {
    await expect(ctx.ds.transaction((m) => lockSchemeVersion(m, 99999999))).rejects.toMatchObject({ status: 404 });
  });

  it('the database itself refuses to change the bins of a locked version or to unlock it', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const v1 = (await postScheme(agent, part.id, { bins: fourBins() }).expect(201)).body;
    await ctx.ds.transaction((m) => lockSchemeVersion(m, v1.id));
    await expect(ctx.ds.query(`UPDATE gain_bin SET hfe_max = 151 WHERE scheme_id = $1 AND code = 'A'`, [v1.id])).rejects.toThrow(/frozen/);
    await expect(ctx.ds.query(`DELETE FROM gain_bin WHERE scheme_id = $1`, [v1.id])).rejects.toThrow(/frozen/);
    await expect(ctx.ds.query(`UPDATE gain_bin_scheme SET locked_at = NULL WHERE id = $1`, [v1.id])).rejects.toThrow(/locked/);
  });

  it('an edit that breaks the rules answers 400 naming the bin; an unknown version answers 404', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    await postScheme(agent, part.id, { bins: fourBins() }).expect(201);
    const bins = fourBins();
    bins[1] = { ...bins[1], hfeMax: 140 };
    const res = await agent.put(`/api/part-types/${part.id}/bin-schemes/1`).set('x-csrf-token', agent.csrf).send({ bins }).expect(400);
    expect(fields(res.body)).toContain('bins[1].hfeMax');
    await agent.put(`/api/part-types/${part.id}/bin-schemes/7`).set('x-csrf-token', agent.csrf).send({ bins: fourBins() }).expect(404);
  });
});

describe('part-type hFE limits and the current scheme', () => {
  it('narrowing the limits past the current scheme answers 409 naming the limit; widening is fine', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    await postScheme(agent, part.id, { bins: fourBins() }).expect(201);
    const res = await agent.patch(`/api/part-types/${part.id}`).set('x-csrf-token', agent.csrf).send({ hfeMin: 120 }).expect(409);
    expect(fields(res.body)).toEqual(['hfeMin']);
    expect(res.body.errors[0].message).toMatch(/bin A/);
    await agent.patch(`/api/part-types/${part.id}`).set('x-csrf-token', agent.csrf).send({ hfeMin: 90, hfeMax: 350 }).expect(200);
  });
});
