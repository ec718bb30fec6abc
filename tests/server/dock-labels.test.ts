import { afterAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { SiteSetting } from '../../server/modules/settings/site-setting.entity.ts';
import { agentFor, signedIn, useTestApp, type Agent } from './helpers.ts';
import { labelElements, lotBody, makeCatalog, postLot, typedLabel, uniq } from './dock-fixtures.ts';

// Envelope "[)>" RS "06" GS … RS EOT (RS 0x1E, GS 0x1D, EOT 0x04): ISO/IEC 15434 (reference.md §3).
// DIs P, 1P, Q, K, 1T, 10D, 4L, 13E, 3S: ANSI MH10.8.2 (reference.md §3). Values are invented.
const RS = '\u001e';
const GS = '\u001d';
const EOT = '\u0004';

const ctx = useTestApp();
afterAll(async () => {
  await ctx.ds.getRepository(SiteSetting).delete({ key: 'scanner' });
});

const parse = (agent: Agent, text: unknown) => agent.post('/api/labels/parse').set('x-csrf-token', agent.csrf).send({ text });

describe('POST /api/labels/parse — ISO/IEC 15434 format 06', () => {
  it('with real control characters, answers the contract shape with fields, unknown DIs and the supplier match', async () => {
    const c = await makeCatalog(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const els = [`P${c.partType.partNumber}`, `1P${c.supplierPartNumber}`, 'Q3000', 'KPO-104552', '1TZ2315A07', '10D2315', '4Lmy', '13EMSL 3', '3SPKG-0001'];
    const res = await parse(agent, `[)>${RS}06${GS}${els.join(GS)}${RS}${EOT}`).expect(200);
    expect(res.body.format).toBe('06');
    expect(res.body.elements).toHaveLength(9);
    expect(res.body.elements[0]).toEqual({ di: 'P', value: c.partType.partNumber });
    expect(res.body.fields).toEqual({
      customerPartNumber: c.partType.partNumber,
      supplierPartNumber: c.supplierPartNumber,
      quantity: 3000,
      purchaseOrder: 'PO-104552',
      supplierLot: 'Z2315A07',
      dateCode: '2315',
      countryOfOrigin: 'MY',
      msl: '3',
    });
    expect(res.body.unknown).toEqual([{ di: '3S', value: 'PKG-0001' }]);
    expect(res.body.warnings).toEqual([]);
    expect(res.body.matches).toEqual([
      { supplierId: c.supplier.id, supplierName: c.supplier.name, supplierCode: c.supplier.code, approval: 'approved', partTypeId: c.partType.id, partNumber: c.partType.partNumber },
    ]);
    expect(res.body.customerPartType).toEqual({ partTypeId: c.partType.id, partNumber: c.partType.partNumber });
    expect(res.body.duplicateOf).toBeNull();
  });

  it('when a field is absent, it is null in fields', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await parse(agent, `[)>${RS}06${GS}1PNOTMAPPED-${uniq()}${GS}Q10${RS}${EOT}`).expect(200);
    expect(res.body.fields).toMatchObject({ customerPartNumber: null, purchaseOrder: null, supplierLot: null, dateCode: null, countryOfOrigin: null, msl: null, quantity: 10 });
    expect(res.body.matches).toEqual([]);
  });

  it('when the scanner types <GS>/<RS>/<EOT> and ^] substitutes, reads the same fields as with control characters', async () => {
    const c = await makeCatalog(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const els = labelElements(c);
    const real = await parse(agent, `[)>${RS}06${GS}${els.join(GS)}${RS}${EOT}`).expect(200);
    const angle = await parse(agent, typedLabel(els) + '\n').expect(200);
    const caret = await parse(agent, `[)>^^06^]${els.join('^]')}^^^D`).expect(200);
    expect(angle.body.fields).toEqual(real.body.fields);
    expect(caret.body.fields).toEqual(real.body.fields);
    expect(angle.body.matches).toHaveLength(1);
  });

  it('when the trailer is missing, reads the fields and warns', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await parse(agent, `[)>${RS}06${GS}1PX-1${GS}Q25`).expect(200);
    expect(res.body.fields.quantity).toBe(25);
    expect(res.body.warnings.join(' ')).toMatch(/trailer missing/);
  });

  it('when an element is empty, skips it with a warning', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await parse(agent, `[)>${RS}06${GS}1PX-1${GS}${GS}Q25${RS}${EOT}`).expect(200);
    expect(res.body.elements).toHaveLength(2);
    expect(res.body.warnings.join(' ')).toMatch(/empty data element at position 2/);
  });

  it('when RS is missing after the header, answers 422 saying so and naming text', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await parse(agent, `[)>06${GS}1PX-1${RS}${EOT}`).expect(422);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(res.body.detail).toMatch(/missing RS/);
    expect(res.body.errors[0].field).toBe('text');
  });

  it('when the envelope is format 05 (GS1), answers 422 naming the format', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await parse(agent, `[)>${RS}05${GS}0109501101530003${RS}${EOT}`).expect(422);
    expect(res.body.detail).toMatch(/format 05/);
  });

  it('when the quantity (DI Q) is not numeric, answers 422 naming DI Q', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await parse(agent, `[)>${RS}06${GS}1PX-1${GS}Q12O0${RS}${EOT}`).expect(422);
    expect(res.body.detail).toMatch(/quantity \(DI Q\) "12O0" is not a number/);
  });

  it('when the label was already received, names the lot in duplicateOf', async () => {
    const c = await makeCatalog(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const labelText = typedLabel(labelElements(c));
    const lot = await postLot(agent, lotBody(c, { labelText })).expect(201);
    // Scanned again with real control characters: the same label.
    const again = await parse(agent, labelText.replace(/<GS>/g, GS).replace(/<RS>/g, RS).replace(/<EOT>/g, EOT)).expect(200);
    expect(again.body.duplicateOf).toEqual({ lotId: lot.body.id, code: lot.body.code });
  });

  it('with no text or an unknown field, answers 400 naming the field', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    const missing = await agent.post('/api/labels/parse').set('x-csrf-token', agent.csrf).send({}).expect(400);
    expect(missing.body.errors.map((e: { field: string }) => e.field)).toContain('text');
    const extra = await agent.post('/api/labels/parse').set('x-csrf-token', agent.csrf).send({ text: 'x', gs: '~' }).expect(400);
    expect(extra.body.errors).toEqual([{ field: 'gs', message: 'gs is not a known field' }]);
  });

  it('without a session, answers 401', async () => {
    const anon = await agentFor(ctx.app);
    await parse(anon, 'L-20260101-0001').expect(401);
  });
});

describe('POST /api/labels/parse — plain codes', () => {
  it('our own lot code answers format null, the raw text, kind lot and the lot', async () => {
    const c = await makeCatalog(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const lot = await postLot(agent, lotBody(c)).expect(201);
    const res = await parse(agent, ` ${lot.body.code.toLowerCase()}\n`).expect(200);
    expect(res.body).toMatchObject({ format: null, raw: ` ${lot.body.code.toLowerCase()}\n`, plainCode: lot.body.code.toLowerCase(), plainCodeKind: 'lot', elements: [], matches: [], duplicateOf: null });
    expect(res.body.lot).toEqual({ lotId: lot.body.id, code: lot.body.code });
    expect(Object.values(res.body.fields).every((v) => v === null)).toBe(true);
  });

  it.each([
    ['C-20260105-0012', 'container'],
    ['PO-104552', 'purchaseOrder'],
    ['HELLO-123', 'unknown'],
    ['L-20260231-0001', 'unknown'], // 31 February is not a date
  ])('%s is classified as %s', async (text, kind) => {
    const { agent } = await signedIn(ctx, 'assembler');
    const res = await parse(agent, text).expect(200);
    expect(res.body.format).toBeNull();
    expect(res.body.plainCodeKind).toBe(kind);
    expect(res.body.lot).toBeNull();
  });
});

describe('GET/PUT /api/settings/scanner', () => {
  it('a quality engineer adds site substitutes; parse then reads labels that use them, and the change is audited', async () => {
    const { agent: qe } = await signedIn(ctx, 'quality');
    const { agent: insp } = await signedIn(ctx, 'inspector');
    const text = `[)>~R06~G1PSITE-1~GQ40~R~E`;
    await parse(insp, text).expect(422);

    const put = await qe.put('/api/settings/scanner').set('x-csrf-token', qe.csrf).send({ gs: ['~G'], rs: ['~R'], eot: ['~E'], purchaseOrderPattern: '^HP\\d{5}$' }).expect(200);
    expect(put.body.configured).toEqual({ gs: ['~G'], rs: ['~R'], eot: ['~E'], purchaseOrderPattern: '^HP\\d{5}$' });
    expect(put.body.defaults.gs).toContain('<GS>');

    const read = await insp.get('/api/settings/scanner').expect(200);
    expect(read.body.configured.gs).toEqual(['~G']);
    const res = await parse(insp, text).expect(200);
    expect(res.body.fields).toMatchObject({ supplierPartNumber: 'SITE-1', quantity: 40 });
    // The built-in substitutes still work next to the site's.
    await parse(insp, '[)><RS>06<GS>1PSITE-1<RS><EOT>').expect(200);
    // The site's purchase-order pattern classifies plain codes.
    expect((await parse(insp, 'HP12345').expect(200)).body.plainCodeKind).toBe('purchaseOrder');

    const [entry] = await ctx.ds.getRepository(AuditEntry).find({ where: { action: 'settings.scanner' }, order: { id: 'DESC' }, take: 1 });
    expect(entry.after).toMatchObject({ gs: ['~G'] });

    await qe.put('/api/settings/scanner').set('x-csrf-token', qe.csrf).send({ gs: [], rs: [], eot: [], purchaseOrderPattern: null }).expect(200);
    await parse(insp, text).expect(422);
  });

  it('a substitute of only letters, one used for two separators, or a bad pattern answers 400 naming each', async () => {
    const { agent: qe } = await signedIn(ctx, 'quality');
    const res = await qe
      .put('/api/settings/scanner')
      .set('x-csrf-token', qe.csrf)
      .send({ gs: ['GS'], rs: ['<GS>'], eot: [''], purchaseOrderPattern: '([' })
      .expect(400);
    const fields = res.body.errors.map((e: { field: string }) => e.field);
    expect(fields).toEqual(expect.arrayContaining(['eot']));
    const res2 = await qe.put('/api/settings/scanner').set('x-csrf-token', qe.csrf).send({ gs: ['GS'], rs: ['<GS>'], eot: [], purchaseOrderPattern: '([' }).expect(400);
    expect(res2.body.errors.map((e: { field: string }) => e.field)).toEqual(['gs[0]', 'rs[0]', 'purchaseOrderPattern']);
  });
});
