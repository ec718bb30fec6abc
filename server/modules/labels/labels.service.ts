import type { DataSource } from 'typeorm';
import type { LotReference, ParseLabelResponse, SupplierMatch } from '../../../shared/api/labels.ts';
import { classifyPlainCode, parseOwnCode } from '../../../shared/domain/labels/index.ts';
import { PartType } from '../catalog/part-type.entity.ts';
import { Lot } from '../lots/lot.entity.ts';
import { SupplierPart } from '../suppliers/supplier.entity.ts';
import { readLabel } from './label-reading.ts';

async function lotRef(ds: DataSource, where: { code: string } | { labelFingerprint: string }): Promise<LotReference | null> {
  const lot = await ds.getRepository(Lot).findOne({ where, select: { id: true, code: true } });
  return lot ? { lotId: lot.id, code: lot.code } : null;
}

/** Supplier mappings of a supplier part number, compared without regard to case. */
async function supplierMatches(ds: DataSource, supplierPartNumber: string): Promise<SupplierMatch[]> {
  const rows = await ds
    .getRepository(SupplierPart)
    .createQueryBuilder('sp')
    .innerJoinAndSelect('sp.supplier', 's')
    .innerJoinAndSelect('sp.partType', 'p')
    .where('upper(sp.supplier_part_number) = upper(:n)', { n: supplierPartNumber })
    .andWhere('p.active = true')
    .orderBy('s.name', 'ASC')
    .addOrderBy('p.part_number', 'ASC')
    .getMany();
  return rows.map((r) => ({
    supplierId: r.supplierId,
    supplierName: r.supplier!.name,
    supplierCode: r.supplier!.code,
    approval: r.supplier!.approval,
    partTypeId: r.partTypeId,
    partNumber: r.partType!.partNumber,
  }));
}

/**
 * Reads scanned text for the Dock: the ISO/IEC 15434 fields, the supplier mappings of its
 * supplier part number, and whether this exact label was already received; or, for a plain
 * code, what kind of code it is and the lot it names.
 */
export async function parseScannedText(ds: DataSource, text: string): Promise<ParseLabelResponse> {
  const { parsed, fingerprint, purchaseOrderPattern } = await readLabel(ds, text);
  const base = {
    ...parsed,
    plainCodeKind: null,
    lot: null,
    matches: [],
    customerPartType: null,
    duplicateOf: null,
  } satisfies ParseLabelResponse;

  if (parsed.format === null) {
    const code = parsed.plainCode ?? '';
    const kind = classifyPlainCode(code, purchaseOrderPattern ? { purchaseOrderPattern } : {});
    const own = kind === 'lot' ? parseOwnCode(code) : null;
    return { ...base, plainCodeKind: kind, lot: own ? await lotRef(ds, { code: own.code }) : null };
  }

  const { supplierPartNumber, customerPartNumber } = parsed.fields;
  const customer = customerPartNumber
    ? await ds
        .getRepository(PartType)
        .createQueryBuilder('p')
        .where('lower(p.part_number) = lower(:n)', { n: customerPartNumber })
        .andWhere('p.active = true')
        .getOne()
    : null;
  return {
    ...base,
    matches: supplierPartNumber ? await supplierMatches(ds, supplierPartNumber) : [],
    customerPartType: customer ? { partTypeId: customer.id, partNumber: customer.partNumber } : null,
    duplicateOf: fingerprint ? await lotRef(ds, { labelFingerprint: fingerprint }) : null,
  };
}
