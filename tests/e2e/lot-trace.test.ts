/**
 * The lot page (Dock) in Chromium: which kits hold parts of the lot (traceability from the lot
 * forward, the kit linked for roles with Pairing), its empty state, and what the page and the
 * bench say after a signed MRB "100 % screen" disposition.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '../../shared/api/auth.ts';
import type { KitDetail } from '../../shared/api/pairing.ts';
import { proposeDisposition, signDisposition } from '../../server/modules/disposition/disposition.service.ts';
import { pullKitPart, reserveKit } from '../../server/modules/pairing/kits.service.ts';
import { makePairingPartType, makeStockLot, type StockLot } from '../server/pairing-fixtures.ts';
import { SHOTS, signIn, startE2e, stopE2e, type E2eContext } from './helpers.ts';

let ctx: E2eContext;
let kitted: StockLot;
let kit: KitDetail;
let screenLot: StockLot;

async function demoUser(email: string): Promise<SessionUser> {
  const [u] = (await ctx.ds.query(`SELECT id, email, name, role FROM app_user WHERE email = $1`, [email])) as SessionUser[];
  if (!u) throw new Error(`no demo user ${email}`);
  return u;
}

beforeAll(async () => {
  ctx = await startE2e();
  const pt = await makePairingPartType(ctx.ds, { matchHfePct: 3, matchVbeMv: 1, prefix: 'TRACE' });
  kitted = await makeStockLot(
    ctx.ds,
    pt,
    [110, 170, 230].flatMap((h, i) => [
      { hfe: h, vbeMv: 642 + i * 5 },
      { hfe: h * 1.01, vbeMv: 642.2 + i * 5 },
    ]),
    { capacity: 6, location: 'Cabinet 7, drawer 1' },
  );
  const assembler = await demoUser('assembler@harrowpoint.test');
  kit = await reserveKit(ctx.ds, assembler, { partTypeId: pt.partTypeId, mode: 'same', setSize: 2, setsWanted: 2, note: 'Trace check' });
  await pullKitPart(ctx.ds, assembler, kit.id, { containerCode: kit.pickList[0]!.containerCode, position: kit.pickList[0]!.position });

  // A lot of 20 with one part screened, whose signed disposition is MRB "100 % screen".
  const spt = await makePairingPartType(ctx.ds, { prefix: 'SCR100' });
  screenLot = await makeStockLot(ctx.ds, spt, [{ hfe: 150, vbeMv: 650 }]);
  await ctx.ds.query(`UPDATE lot SET quantity = 20 WHERE id = $1`, [screenLot.lotId]);
  const decision = { decision: 'mrb' as const, mrbAction: 'screen-100' as const, reason: 'Mixed gain in the sample: screen every part into bins.' };
  await proposeDisposition(ctx.ds, await demoUser('inspector@harrowpoint.test'), screenLot.lotId, decision);
  await signDisposition(ctx.ds, await demoUser('quality@harrowpoint.test'), screenLot.lotId, decision);
});

afterAll(async () => {
  await stopE2e(ctx);
});

describe('the lot page in Chromium', () => {
  it('a quality engineer sees the kits holding parts of the lot — code linked to the kit, status, parts, when pulled — and opens the kit', async () => {
    const page = await signIn(ctx, 'quality@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/dock/lots/${kitted.lotId}`);
    const table = page.getByRole('table', { name: `Kits with parts of lot ${kitted.lotCode}` });
    await table.waitFor();
    const row = table.locator('tbody tr');
    expect(await row.count()).toBe(1);
    const text = (await row.first().textContent()) ?? '';
    expect(text).toContain('Picking');
    expect(text).toContain('4 (1 pulled)');
    expect(text).not.toContain('not yet');
    await page.screenshot({ path: `${SHOTS}/lot-kits.png`, fullPage: true });
    await row.getByRole('link', { name: kit.code }).click();
    await page.getByRole('heading', { level: 1, name: `Kit ${kit.code}` }).waitFor();
    // And back: the kit names the lot, linked to the lot page.
    await page.getByRole('list', { name: 'Source lots' }).getByRole('link', { name: kitted.lotCode }).click();
    await page.getByRole('heading', { level: 1, name: `Lot ${kitted.lotCode}` }).waitFor();
    await page.close();
  });

  it('an inspector, whose role has no Pairing, sees the kit code as text; a lot without kits says so', async () => {
    const page = await signIn(ctx, 'inspector@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/dock/lots/${kitted.lotId}`);
    const table = page.getByRole('table', { name: `Kits with parts of lot ${kitted.lotCode}` });
    await table.getByText(kit.code).waitFor();
    expect(await table.getByRole('link').count()).toBe(0);
    await page.goto(`${ctx.baseUrl}/dock/lots/${screenLot.lotId}`);
    await page.getByTestId('lot-kits-empty').getByText(`No kit holds parts of lot ${screenLot.lotCode}`).waitFor();
    await page.close();
  });

  it('after a signed MRB "100 % screen" the lot page says screening is next and the bench starts only a screening session', async () => {
    const page = await signIn(ctx, 'inspector@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.setViewportSize({ width: 1366, height: 900 });
    await page.goto(`${ctx.baseUrl}/dock/lots/${screenLot.lotId}`);
    const note = page.getByTestId('screen-after-signing');
    await note.getByText('Signed disposition: MRB — 100 % screen').waitFor();
    await page.screenshot({ path: `${SHOTS}/lot-screen-after-signing.png`, fullPage: true });
    await note.getByRole('link', { name: 'Screen at the bench' }).click();
    await page.getByRole('heading', { level: 1, name: new RegExp(screenLot.lotCode) }).waitFor();
    await page.getByText('100 % screening after the signed disposition').waitFor();
    const form = page.getByRole('form', { name: 'Start a measurement session' });
    const mode = form.getByLabel('Mode');
    expect(await mode.locator('option').allTextContents()).toEqual(['100 % screening']);
    await form.getByLabel('Instrument').fill('Bench tester 3');
    await form.getByRole('button', { name: 'Start session' }).click();
    await page.getByTestId('open-session').getByText('100 % screening').waitFor();
    await page.screenshot({ path: `${SHOTS}/bench-screen-after-signing.png`, fullPage: true });
    const [session] = (await ctx.ds.query(`SELECT mode FROM measurement_session WHERE lot_id = $1 AND closed_at IS NULL`, [screenLot.lotId])) as { mode: string }[];
    expect(session?.mode).toBe('screen');
    await page.close();
  });
});
