import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { ApprovalStatus } from '../../shared/api/lots.ts';
import { PartType } from '../../server/modules/catalog/part-type.entity.ts';
import { Supplier, SupplierPart } from '../../server/modules/suppliers/supplier.entity.ts';
import type { Agent } from './helpers.ts';

export const uniq = () => randomUUID().replace(/-/g, '').slice(0, 10).toUpperCase();

export interface DockCatalog {
  partType: PartType;
  supplier: Supplier;
  supplierPartNumber: string;
}

/**
 * An invented part type, supplier and supplier-part mapping written straight through TypeORM
 * (the catalog API is built separately).
 */
export async function makeCatalog(
  ds: DataSource,
  o: { approval?: ApprovalStatus; msl?: string; esdHbmClass?: string | null; supplier?: Supplier } = {},
): Promise<DockCatalog> {
  const u = uniq();
  const partType = await ds.getRepository(PartType).save(
    ds.getRepository(PartType).create({
      partNumber: `DK-${u}`,
      description: 'Invented NPN small-signal for dock tests',
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
      msl: o.msl ?? '3',
      esdHbmClass: o.esdHbmClass === undefined ? '1B' : o.esdHbmClass,
      samplingMethod: 'attribute',
      inspectionLevel: 'II',
      aql: 1,
      matchHfePct: 5,
      matchVbeMv: 2,
      active: true,
    }),
  );
  const supplier =
    o.supplier ??
    (await ds.getRepository(Supplier).save(
      ds.getRepository(Supplier).create({ code: `DK${u}`, name: `Dock Test Distributor ${u}`, approval: o.approval ?? 'approved', notes: null }),
    ));
  const supplierPartNumber = `SPN-${u}`;
  await ds.getRepository(SupplierPart).save(ds.getRepository(SupplierPart).create({ supplierId: supplier.id, supplierPartNumber, partTypeId: partType.id }));
  return { partType, supplier, supplierPartNumber };
}

/** A format-06 label as a keyboard-wedge scanner types it, with <GS>/<RS>/<EOT> substitutes. */
export function typedLabel(elements: string[]): string {
  return `[)><RS>06<GS>${elements.join('<GS>')}<RS><EOT>`;
}

/** Label elements (ANSI MH10.8.2 DIs) for a catalog; invented values, unique per call. */
export function labelElements(c: DockCatalog, extra: string[] = []): string[] {
  return [`P${c.partType.partNumber}`, `1P${c.supplierPartNumber}`, 'Q500', `KPO-${uniq().slice(0, 6)}`, `1T${uniq()}`, '10D2331', '4LMY', '13E3', ...extra];
}

export function lotBody(c: DockCatalog, extra: Record<string, unknown> = {}) {
  return { supplierId: c.supplier.id, partTypeId: c.partType.id, quantity: 500, dryBag: 'sealed', ...extra };
}

export function postLot(agent: Agent, body: object) {
  return agent.post('/api/lots').set('x-csrf-token', agent.csrf).send(body);
}
