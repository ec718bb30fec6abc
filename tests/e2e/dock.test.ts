import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PartType } from '../../server/modules/catalog/part-type.entity.ts';
import { Supplier, SupplierPart } from '../../server/modules/suppliers/supplier.entity.ts';
import { SHOTS, signIn, startE2e, stopE2e, type E2eContext } from './helpers.ts';

let ctx: E2eContext;
const u = `${Date.now().toString(36).toUpperCase()}`;
const PART = `E2E-${u}`;
const SPN = `BW-SPN-${u}`;
const SUPPLIER = `Quayside Test Components ${u}`;

// A format-06 label (ISO/IEC 15434) with ANSI MH10.8.2 DIs, typed as a keyboard-wedge scanner
// that sends <RS>/<GS>/<EOT> for the control characters. 3S has no field: it must be kept and shown.
const LABEL = `[)><RS>06<GS>P${PART}<GS>1P${SPN}<GS>Q500<GS>KPO-${u}<GS>1TZ${u}<GS>10D2331<GS>4LMY<GS>13E3<GS>3SPKG-${u}<RS><EOT>`;

beforeAll(async () => {
  ctx = await startE2e();
  const partType = await ctx.ds.getRepository(PartType).save(
    ctx.ds.getRepository(PartType).create({
      partNumber: PART,
      description: 'Invented NPN small-signal, gain group B',
      polarity: 'NPN',
      packageName: 'SOT-23',
      hfeIcMa: 2,
      hfeVceV: 5,
      vbeIcMa: 2,
      hfeMin: 200,
      hfeMax: 450,
      vbeMinMv: null,
      vbeMaxMv: null,
      vbeTcMvPerC: -2,
      hfeTcPctPerC: 0.5,
      msl: '3',
      esdHbmClass: '1B',
      samplingMethod: 'attribute',
      inspectionLevel: 'II',
      aql: 1,
      matchHfePct: 5,
      matchVbeMv: 2,
      active: true,
    }),
  );
  const supplier = await ctx.ds.getRepository(Supplier).save(ctx.ds.getRepository(Supplier).create({ code: `QT${u}`.slice(0, 20), name: SUPPLIER, approval: 'approved', notes: null }));
  await ctx.ds.getRepository(SupplierPart).save(ctx.ds.getRepository(SupplierPart).create({ supplierId: supplier.id, supplierPartNumber: SPN, partTypeId: partType.id }));
});
afterAll(async () => {
  await stopE2e(ctx);
});

/** A small valid PDF; the content is unique per run so the document store never sees it twice. */
function certificate(): Buffer {
  return Buffer.from(`%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[]/Count 0>>endobj\n% CoC ${u}\ntrailer<</Root 1 0 R>>\n%%EOF\n`);
}

describe('Dock in Chromium', () => {
  it('the inspector scans a label, receives the lot, drops a CoC and opens the traveler PDF', async () => {
    const page = await signIn(ctx, 'inspector@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: 'Dock' }).click();
    const scan = page.getByLabel('Scan a supplier label, or type a lot code or PO number');
    await scan.waitFor();
    expect(await scan.evaluate((el) => el.ownerDocument.activeElement === el)).toBe(true);

    // The scanner types the whole message at full speed, then Enter.
    await page.keyboard.type(LABEL);
    await page.keyboard.press('Enter');
    const parsed = page.getByTestId('parsed-label');
    await parsed.waitFor();
    expect(await parsed.textContent()).toContain(SPN);
    await page.getByRole('list', { name: 'Unmapped data identifiers' }).getByText(`PKG-${u}`).waitFor();

    const form = page.getByRole('form', { name: 'Receive lot' });
    const selected = (label: string) => form.getByLabel(label, { exact: true }).locator('option:checked').textContent();
    await expect.poll(() => selected('Supplier')).toContain(SUPPLIER);
    expect(await selected('Part type')).toContain(PART);
    expect(await form.getByLabel('Quantity (pcs)').inputValue()).toBe('500');
    expect(await form.getByLabel('Purchase order').inputValue()).toBe(`PO-${u}`);
    expect(await form.getByLabel('Supplier lot').inputValue()).toBe(`Z${u}`);
    expect(await form.getByLabel('Date code').inputValue()).toBe('2331');
    expect(await form.getByLabel('Country of origin').inputValue()).toBe('MY');
    expect(await form.getByLabel('MSL on the label').inputValue()).toBe('3');
    expect(await form.getByLabel('Sealed dry bag').isChecked()).toBe(true);
    await form.getByText('MSL 3: moisture-sensitive').waitFor();
    await page.screenshot({ path: `${SHOTS}/dock-scan.png`, fullPage: true });

    await form.getByRole('button', { name: 'Receive lot' }).click();
    await page.waitForURL(/\/dock\/lots\/\d+$/);
    const heading = page.getByRole('heading', { level: 1, name: /^Lot L-/ });
    await heading.waitFor();
    const code = (await heading.textContent())!.replace('Lot ', '');
    expect(code).toMatch(/^L-\d{8}-\d{4}$/);
    await page.getByText('ESD sensitive — HBM class 1B (500 V to < 1000 V)').waitFor();
    await page.getByTestId('floor-life').getByText('Dry bag sealed', { exact: true }).waitFor();

    // Drop the certificate onto the drop zone.
    await page.getByTestId('document-dropzone').locator('input[type=file]').setInputFiles({ name: `CoC ${u}.pdf`, mimeType: 'application/pdf', buffer: certificate() });
    await page.getByRole('link', { name: `CoC ${u}.pdf` }).waitFor();
    await page.getByText('✓ Attached').waitFor();

    // A renamed executable is refused with the server's reason.
    await page.getByTestId('document-dropzone').locator('input[type=file]').setInputFiles({
      name: 'photo.jpg',
      mimeType: 'image/jpeg',
      buffer: Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 0x02, 0x01, 0x01, 0x00]), Buffer.alloc(64)]),
    });
    await page.getByRole('alert').filter({ hasText: 'ELF executable' }).waitFor();

    // The traveler: choose a stock, check the link, fetch it within the session and keep it.
    await page.getByLabel('Label stock').selectOption('100x150');
    const link = page.getByRole('link', { name: 'Open traveler PDF' });
    expect(await link.getAttribute('target')).toBe('_blank');
    const href = (await link.getAttribute('href'))!;
    expect(href).toMatch(/\/traveler\.pdf\?stock=100x150$/);
    const pdf = await page.evaluate(async (url) => {
      const r = await fetch(url);
      return { status: r.status, type: r.headers.get('content-type'), bytes: Array.from(new Uint8Array(await r.arrayBuffer())) };
    }, href);
    expect(pdf.status).toBe(200);
    expect(pdf.type).toBe('application/pdf');
    const pdfPath = path.join(SHOTS, 'dock-traveler.pdf');
    fs.writeFileSync(pdfPath, Buffer.from(pdf.bytes));
    expect(Buffer.from(pdf.bytes).subarray(0, 5).toString()).toBe('%PDF-');
    const png = spawnSync('pdftoppm', ['-r', '80', '-png', '-singlefile', pdfPath, path.join(SHOTS, 'dock-traveler')]);
    if (png.error) console.warn('[dock e2e] pdftoppm is not installed: the traveler was not rendered to PNG');
    await page.screenshot({ path: `${SHOTS}/dock-lot.png`, fullPage: true });

    // Start the floor-life clock.
    await page.getByRole('button', { name: 'Bag opened — start the clock' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Start the clock' }).click();
    await page.getByTestId('floor-life').getByText('Floor life running', { exact: true }).waitFor();

    // Scanning the same label again warns and links to the lot; no second lot.
    await page.getByRole('link', { name: '← Dock' }).click();
    await scan.waitFor();
    await page.keyboard.type(LABEL.replace(/<GS>/g, '^]'));
    await page.keyboard.press('Enter');
    await page.getByText('This label was already received').waitFor();
    await page.getByRole('form', { name: 'Receive lot' }).getByRole('link', { name: code }).waitFor();
    expect(await page.getByRole('button', { name: 'Receive lot' }).isDisabled()).toBe(true);

    // The lots table lists the lot with its floor life, filtered by search.
    await page.getByRole('search', { name: 'Filter lots' }).getByLabel('Search').fill(code);
    const row = page.getByRole('row').filter({ hasText: code });
    await row.waitFor();
    expect(await row.textContent()).toMatch(/left/);
    await page.screenshot({ path: `${SHOTS}/dock-duplicate.png`, fullPage: true });
    await page.close();
  });

  it('a quality engineer receives from a supplier that is not approved only with an override reason', async () => {
    const part = await ctx.ds.getRepository(PartType).findOneByOrFail({ partNumber: PART });
    const blocked = await ctx.ds
      .getRepository(Supplier)
      .save(ctx.ds.getRepository(Supplier).create({ code: `NA${u}`.slice(0, 20), name: `Unvetted Broker ${u}`, approval: 'not-approved', notes: null }));
    const page = await signIn(ctx, 'quality@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/dock`);
    await page.getByLabel('Scan a supplier label, or type a lot code or PO number').waitFor();
    await page.keyboard.type('PO-778812');
    await page.keyboard.press('Enter');
    await page.getByText('Purchase order PO-778812').waitFor();
    const form = page.getByRole('form', { name: 'Receive lot' });
    expect(await form.getByLabel('Purchase order').inputValue()).toBe('PO-778812');
    await form.getByLabel('Supplier', { exact: true }).selectOption(String(blocked.id));
    await form.getByLabel('Part type').selectOption(String(part.id));
    await form.getByLabel('Quantity (pcs)').fill('40');
    // The part type is MSL 3: the form suggests a sealed dry bag.
    expect(await form.getByLabel('Sealed dry bag').isChecked()).toBe(true);
    await form.getByText(`Unvetted Broker ${u} is not an approved supplier`).waitFor();
    await form.getByLabel('Override reason').fill('short');
    await form.getByRole('button', { name: 'Receive lot' }).click();
    await form.getByText('override.reason must say why').waitFor();
    expect(await form.getByLabel('Quantity (pcs)').inputValue()).toBe('40');
    await page.screenshot({ path: `${SHOTS}/dock-override.png`, fullPage: true });
    await form.getByLabel('Override reason').fill('Only source for the repair order; 100 % screening before use');
    await form.getByRole('button', { name: 'Receive lot' }).click();
    await page.waitForURL(/\/dock\/lots\/\d+$/);
    await page.getByText(/Supplier approval overridden by/).waitFor();
    // Quality engineers find the scanner settings on the Dock page.
    await page.getByRole('link', { name: '← Dock' }).click();
    await page.getByText('Scanner separator settings (quality engineers)').click();
    await page.getByRole('form', { name: 'Scanner settings' }).getByText(/Built in: GS as <GS>/).waitFor();
    await page.close();
  });
});
