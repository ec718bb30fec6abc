import type { LabelElement, LabelFields, PlainCodeKind } from '../domain/labels/index.ts';
import type { ApprovalStatus } from './lots.ts';

export interface ParseLabelRequest {
  text: string;
}

/** A supplier part number of the label that the supplier mapping ties to one of our part types. */
export interface SupplierMatch {
  supplierId: number;
  supplierName: string;
  supplierCode: string;
  approval: ApprovalStatus;
  partTypeId: number;
  partNumber: string;
}

export interface LotReference {
  lotId: number;
  code: string;
}

/** POST /api/labels/parse answer. `format` is null when the text is not an ISO/IEC 15434 message. */
export interface ParseLabelResponse {
  format: string | null;
  elements: LabelElement[];
  fields: LabelFields;
  unknown: LabelElement[];
  warnings: string[];
  raw: string;
  /** Trimmed text of a plain (non-15434) code; null for a 15434 message. */
  plainCode: string | null;
  /** What the plain code is: our lot or container code, a purchase order, or unknown. */
  plainCodeKind: PlainCodeKind | null;
  /** The lot when the plain code is one of our lot codes and that lot exists. */
  lot: LotReference | null;
  /** Supplier mappings of the label's supplier part number (1P). */
  matches: SupplierMatch[];
  /** Our part type whose part number equals the label's customer part number (P). */
  customerPartType: { partTypeId: number; partNumber: string } | null;
  /** The lot already received from this exact label. */
  duplicateOf: LotReference | null;
}
