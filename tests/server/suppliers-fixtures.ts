import { randomUUID } from 'node:crypto';
import os from 'node:os';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import { PartType } from '../../server/modules/catalog/part-type.entity.ts';
import { Supplier, SupplierContact } from '../../server/modules/suppliers/supplier.entity.ts';
import type { User } from '../../server/modules/users/user.entity.ts';
import { insertHistoricLot, type HistoricLotSpec } from '../../seed/demo-history.ts';
import { makeUser } from './helpers.ts';

export const uniq = () => randomUUID().replace(/-/g, '').slice(0, 8).toUpperCase();
export const DAY = 86_400_000;

export interface SupplierWorld {
  supplier: Supplier;
  partType: PartType;
  inspector: User;
  quality: User;
  /** Adds a disposed lot with sample readings (hFE at 25 °C); Vbe 650 mV unless given. */
  lot(o: { status: HistoricLotSpec['status']; hfe: number[]; receivedAt?: Date; coc?: Date | null; quantity?: number; dateCode?: string }): Promise<{ lotId: number; code: string }>;
}

/** An invented supplier (with or without a quality contact), part type (hFE 100–300) and users. */
export async function makeSupplierWorld(ds: DataSource, o: { contacts?: { name: string; email: string; duty: string | null }[] } = {}): Promise<SupplierWorld> {
  const u = uniq();
  const supplier = await ds.getRepository(Supplier).save(ds.getRepository(Supplier).create({ code: `SQ${u}`, name: `Sparrowgate Test Supply ${u}`, approval: 'approved', notes: null }));
  for (const c of o.contacts ?? [
    { name: 'Sales Person', email: `sales-${u}@supplier.example.test`, duty: 'sales' },
    { name: 'Quality Person', email: `quality-${u}@supplier.example.test`, duty: 'quality' },
  ]) {
    await ds.getRepository(SupplierContact).save(ds.getRepository(SupplierContact).create({ ...c, supplierId: supplier.id, phone: null }));
  }
  const partType = await ds.getRepository(PartType).save(
    ds.getRepository(PartType).create({
      partNumber: `SQ-${u}`,
      description: 'Invented NPN small-signal for supplier tests',
      polarity: 'NPN',
      packageName: 'TO-92',
      hfeIcMa: 2,
      hfeVceV: 5,
      vbeIcMa: 2,
      hfeMin: 100,
      hfeMax: 300,
      vbeMinMv: 580,
      vbeMaxMv: 720,
      vbeTcMvPerC: -2,
      hfeTcPctPerC: 0.5,
      msl: 'not-classified',
      esdHbmClass: '1B',
      samplingMethod: 'attribute',
      inspectionLevel: 'II',
      aql: 1,
      matchHfePct: 5,
      matchVbeMv: 2,
      active: true,
    }),
  );
  const inspector = await makeUser(ds, 'inspector');
  const quality = await makeUser(ds, 'quality');
  const docs = path.join(os.tmpdir(), `bw-sq-docs-${u}`);
  let day = 0;
  return {
    supplier,
    partType,
    inspector,
    quality,
    lot: (l) =>
      ds.transaction((m) =>
        insertHistoricLot(m, {
          supplierId: supplier.id,
          partTypeId: partType.id,
          receivedAt: l.receivedAt ?? new Date(Date.now() - (60 - day++) * DAY),
          quantity: l.quantity ?? 1000,
          status: l.status,
          supplierLot: `SL-${uniq()}`,
          dateCode: l.dateCode ?? '2630',
          purchaseOrder: 'PO-TEST',
          readings: l.hfe.map((hfe) => ({ hfe, vbeMv: 650 })),
          inspectorId: inspector.id,
          qualityId: quality.id,
          reason: 'test',
          coc: l.coc ? { uploadedAt: l.coc, documentsRoot: docs } : null,
        }),
      ),
  };
}
