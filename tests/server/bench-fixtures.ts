import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { GainBinRow, GainBinSchemeVersion } from '../../server/modules/catalog/gain-bin-scheme.entity.ts';
import { PartType } from '../../server/modules/catalog/part-type.entity.ts';
import { Lot, type LotStatus } from '../../server/modules/lots/lot.entity.ts';
import { Supplier } from '../../server/modules/suppliers/supplier.entity.ts';
import { makeUser } from './helpers.ts';
import { inventedBenchNpn } from '../../scripts/lib/bench-fixtures.ts';

const uniq = () => randomUUID().replace(/-/g, '').slice(0, 10);

export interface BenchFixture {
  lot: Lot;
  partType: PartType;
  supplier: Supplier;
}

export interface FixtureOptions {
  quantity?: number;
  status?: LotStatus;
  part?: Partial<PartType>;
  /** Gain bins of a scheme version attached to the lot. */
  bins?: { code: string; hfeMin: number; hfeMax: number }[];
  /** Reuse a supplier and/or part type (switching scenarios). */
  supplier?: Supplier;
  partType?: PartType;
}

/** Creates a supplier, a part type (invented test part) and a lot directly through TypeORM. */
export async function makeBenchLot(ds: DataSource, o: FixtureOptions = {}): Promise<BenchFixture> {
  const receiver = await makeUser(ds, 'inspector');
  const supplier =
    o.supplier ??
    (await ds.getRepository(Supplier).save(ds.getRepository(Supplier).create({ code: `T${uniq()}`.slice(0, 20), name: `Test Distributor ${uniq()}`, approval: 'approved', notes: null })));
  const partType =
    o.partType ??
    (await ds.getRepository(PartType).save(
      ds.getRepository(PartType).create({
        // The benches' invented NPN, with the 100–300 hFE limits these tests are written against.
        ...inventedBenchNpn(`TST-${uniq()}`, 'Test NPN small-signal'),
        hfeMin: 100,
        hfeMax: 300,
        ...o.part,
      }),
    ));
  let binSchemeId: number | null = null;
  if (o.bins) {
    const scheme = await ds.getRepository(GainBinSchemeVersion).save(
      ds.getRepository(GainBinSchemeVersion).create({ partTypeId: partType.id, version: Math.floor(Math.random() * 1e6), note: null, lockedAt: null, createdBy: null }),
    );
    await ds.getRepository(GainBinRow).save(
      o.bins.map((b, i) => ds.getRepository(GainBinRow).create({ schemeId: scheme.id, position: i + 1, code: b.code, label: `Bin ${b.code}`, hfeMin: b.hfeMin, hfeMax: b.hfeMax, vbeMinMv: null, vbeMaxMv: null, gapBeforeIntended: false })),
    );
    binSchemeId = scheme.id;
  }
  const lot = await ds.getRepository(Lot).save(
    ds.getRepository(Lot).create({
      code: `L-T-${uniq()}`,
      supplierId: supplier.id,
      partTypeId: partType.id,
      quantity: o.quantity ?? 1000,
      purchaseOrder: 'PO-TEST',
      supplierPartNumber: null,
      supplierLot: 'SL-1',
      dateCode: '2540',
      countryOfOrigin: null,
      msl: null,
      dryBag: 'not-applicable',
      bagOpenedAt: null,
      status: o.status ?? 'received',
      labelRaw: null,
      labelFingerprint: null,
      labelElements: null,
      binSchemeId,
      receivedBy: receiver.id,
      overrideBy: null,
      overrideReason: null,
    }),
  );
  return { lot, partType, supplier };
}

/** Builds a tester CSV: header plus one line per reading (position, hFE, Vbe in volts). */
export function testerCsv(rows: [number, number | string, number | string][], header = 'Pos,HFE,VBE_V'): string {
  return `${header}\n${rows.map((r) => r.join(',')).join('\n')}\n`;
}

export const DEFAULT_MAPPING = { position: 'Pos', hfe: 'HFE', vbe: 'VBE_V' };
export const DEFAULT_UNITS = { vbe: 'V', vceSat: 'mV', leakage: 'nA' };
