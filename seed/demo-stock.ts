/**
 * Demo stock for Bins and Pairing: two gain-critical lots (HPA-N201 and its PNP complement
 * HPA-P202 from the fictional Kestrel Lane Components) screened 100 % into gain-bin strips with
 * numbered positions. Readings go through the real Bench and Bins services, so the containers,
 * positions, movements and audit trail are what the product itself would have made.
 * Invented data, seeded and reproducible; idempotent (skipped when the demo lots exist).
 */
import type { DataSource } from 'typeorm';
import type { SessionUser } from '../shared/api/auth.ts';
import { createLot } from '../server/modules/lots/lots.service.ts';
import { recordMeasurement } from '../server/modules/measurements/measurements.service.ts';
import { closeSession, startSession } from '../server/modules/measurements/sessions.service.ts';
import { moveContainer } from '../server/modules/bins/containers.service.ts';

const MARKER = 'SCREEN-DEMO';

/** Mulberry32: a small seeded generator, so the demo is the same on every machine. */
function mulberry32(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function gaussian(rng: () => number, mean: number, sd: number): number {
  const u = Math.max(rng(), 1e-12);
  return mean + sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rng());
}

const LOTS = [
  { partNumber: 'HPA-N201', spn: 'KL-2201-T92', quantity: 160, hfe: [205, 32], vbeMv: [652, 3.5], seed: 501, po: 'PO-24117' },
  { partNumber: 'HPA-P202', spn: 'KL-2202-T92', quantity: 120, hfe: [198, 30], vbeMv: [655, 3.5], seed: 502, po: 'PO-24117' },
] as const;

const SHELVES = ['Stores A-01', 'Stores A-02', 'Stores A-03', 'Stores B-01'];

export async function seedDemoStock(ds: DataSource, log: (l: string) => void = () => {}): Promise<number> {
  const [done] = (await ds.query(`SELECT 1 FROM lot WHERE supplier_lot LIKE $1 LIMIT 1`, [`%${MARKER}%`])) as unknown[];
  if (done) return 0;
  const [inspector] = (await ds.query(`SELECT id, email, name, role FROM app_user WHERE email = 'inspector@harrowpoint.test'`)) as SessionUser[];
  const [supplier] = (await ds.query(`SELECT id FROM supplier WHERE code = 'KLC'`)) as { id: number }[];
  if (!inspector || !supplier) return 0;
  let parts = 0;
  for (const def of LOTS) {
    const [pt] = (await ds.query(`SELECT id FROM part_type WHERE part_number = $1`, [def.partNumber])) as { id: number }[];
    if (!pt) continue;
    const rng = mulberry32(def.seed);
    const lot = await createLot(ds, inspector, {
      supplierId: supplier.id,
      partTypeId: pt.id,
      quantity: def.quantity,
      purchaseOrder: def.po,
      supplierPartNumber: def.spn,
      supplierLot: `KLC-${def.partNumber.slice(4)}-${MARKER}`,
      dateCode: '2647',
      countryOfOrigin: 'DE',
      msl: null,
      dryBag: 'not-applicable',
    });
    const session = await startSession(ds, inspector, lot.id, { instrument: 'Bench tester 2', ambientC: 23.5, mode: 'screen' });
    for (let position = 1; position <= def.quantity; position++) {
      const hfe = Math.round(gaussian(rng, def.hfe[0], def.hfe[1]) * 10) / 10;
      const vbe = Math.round(gaussian(rng, def.vbeMv[0], def.vbeMv[1]) * 10) / 10;
      await recordMeasurement(ds, inspector, lot.id, { sessionId: session.id, position, hfe, vbe, vbeUnit: 'mV' });
      parts++;
    }
    await closeSession(ds, inspector, lot.id, session.id);
    const containers = (await ds.query(`SELECT id FROM container WHERE lot_id = $1 ORDER BY id`, [lot.id])) as { id: number }[];
    for (const [i, c] of containers.entries()) {
      await moveContainer(ds, inspector, c.id, { toLocation: SHELVES[i % SHELVES.length] });
    }
  }
  if (parts) log(`Demo scenario: screened ${parts} parts into gain-bin strips.`);
  return parts;
}
