/**
 * Request and response types of the Catalog: part types, gain-bin schemes and suppliers.
 * Server DTOs implement the request types; services return the response types.
 */
import type { GainBin } from '../domain/binning/index.ts';
import { MSL_LEVELS } from '../domain/moisture/index.ts';
import type { SamplingMethod } from '../domain/sampling/index.ts';

export const POLARITIES = ['NPN', 'PNP'] as const;
export type Polarity = (typeof POLARITIES)[number];

/** J-STD-020 levels plus 'not-classified' (through-hole parts usually are not, reference.md §6). */
export const MSL_CHOICES = [...MSL_LEVELS, 'not-classified'] as const;
export type MslChoice = (typeof MSL_CHOICES)[number];

/** A part type as the API shows it. Units are in the names: mA, V, mV, %, °C. */
export interface PartTypeRow {
  id: number;
  partNumber: string;
  description: string;
  polarity: Polarity;
  packageName: string;
  /** hFE test condition: collector current (mA) and collector-emitter voltage magnitude (V). */
  hfeIcMa: number;
  hfeVceV: number;
  /** Vbe test condition: collector current (mA). */
  vbeIcMa: number;
  /** Limits; null = open on that side. */
  hfeMin: number | null;
  hfeMax: number | null;
  vbeMinMv: number | null;
  vbeMaxMv: number | null;
  /** Temperature coefficients for normalising to 25 °C. */
  vbeTcMvPerC: number;
  hfeTcPctPerC: number;
  msl: MslChoice;
  /** JS-001 HBM class id, e.g. '1B'; null when unknown. */
  esdHbmClass: string | null;
  samplingMethod: SamplingMethod;
  inspectionLevel: string;
  aql: number;
  /** Default matching tolerances: hFE difference in %, Vbe difference in mV. */
  matchHfePct: number;
  matchVbeMv: number;
  active: boolean;
  /** Highest gain-bin scheme version, null when the part has none yet. */
  currentSchemeVersion: number | null;
  createdAt: string;
  updatedAt: string;
}

/** A supplier part number that maps to this part type. */
export interface PartTypeSupplierRef {
  mappingId: number;
  supplierId: number;
  supplierCode: string;
  supplierName: string;
  approval: ApprovalStatus;
  supplierPartNumber: string;
}

export interface PartTypeDetail extends PartTypeRow {
  suppliers: PartTypeSupplierRef[];
}

/** Body of POST /api/part-types. Fields left out take the defaults shown in the form. */
export interface PartTypeInput {
  partNumber: string;
  description: string;
  polarity: Polarity;
  packageName: string;
  hfeIcMa: number;
  hfeVceV: number;
  vbeIcMa: number;
  hfeMin?: number | null;
  hfeMax?: number | null;
  vbeMinMv?: number | null;
  vbeMaxMv?: number | null;
  vbeTcMvPerC?: number;
  hfeTcPctPerC?: number;
  msl: MslChoice;
  esdHbmClass?: string | null;
  samplingMethod?: SamplingMethod;
  inspectionLevel?: string;
  aql?: number;
  matchHfePct?: number;
  matchVbeMv?: number;
  active?: boolean;
}

/** Body of PATCH /api/part-types/:id: any subset of the input. */
export type PartTypeUpdate = Partial<PartTypeInput>;

/** Defaults the server applies when a create request leaves a field out. */
export const PART_TYPE_DEFAULTS = {
  vbeTcMvPerC: -2,
  hfeTcPctPerC: 0.5,
  samplingMethod: 'attribute',
  inspectionLevel: 'II',
  aql: 1.0,
  matchHfePct: 5,
  matchVbeMv: 2,
} as const;

/** Columns the part-type list can be sorted by. */
export const PART_TYPE_SORTS = [
  'partNumber',
  'description',
  'polarity',
  'packageName',
  'hfeIcMa',
  'hfeMin',
  'hfeMax',
  'vbeMinMv',
  'vbeMaxMv',
  'msl',
  'esdHbmClass',
  'samplingMethod',
  'aql',
  'active',
  'updatedAt',
] as const;
export type PartTypeSort = (typeof PART_TYPE_SORTS)[number];

export interface PartTypeListQuery {
  page: number;
  pageSize: number;
  search?: string;
  polarity?: Polarity | '';
  package?: string;
  /** 'true' or 'false'; absent = both. */
  active?: 'true' | 'false' | '';
  sort?: PartTypeSort;
  dir?: 'asc' | 'desc';
}

// ---------------------------------------------------------------------------------------------
// Gain-bin schemes

/** One bin as sent by the client; the same shape as shared/domain/binning GainBin. */
export interface GainBinInput extends GainBin {
  code: string;
  label: string;
  hfeMin: number;
  hfeMax: number;
  vbeMinMv?: number | null;
  vbeMaxMv?: number | null;
  gapBeforeIntended?: boolean;
}

export interface GainBinOut {
  id: number;
  position: number;
  code: string;
  label: string;
  hfeMin: number;
  hfeMax: number;
  vbeMinMv: number | null;
  vbeMaxMv: number | null;
  gapBeforeIntended: boolean;
}

export interface BinSchemeVersionRow {
  id: number;
  partTypeId: number;
  version: number;
  note: string | null;
  /** The highest version of the part type: the one new lots use. */
  current: boolean;
  /** When the version was frozen explicitly (a lot started using it). */
  lockedAt: string | null;
  /** How many lots reference this version. */
  lotCount: number;
  /** Frozen: lockedAt is set or a lot references it. Editing then needs a new version. */
  locked: boolean;
  createdByName: string | null;
  createdAt: string;
  bins: GainBinOut[];
}

/** Body of POST /api/part-types/:id/bin-schemes and PUT …/bin-schemes/:version. */
export interface BinSchemeInput {
  note?: string | null;
  bins: GainBinInput[];
}

/** Problem code of the 409 when a used or locked version is edited. */
export const SCHEME_LOCKED_CODE = 'scheme-locked';

// ---------------------------------------------------------------------------------------------
// Suppliers

export const APPROVAL_STATUSES = ['approved', 'conditional', 'not-approved'] as const;
export type ApprovalStatus = (typeof APPROVAL_STATUSES)[number];

export const APPROVAL_LABELS: Readonly<Record<ApprovalStatus, string>> = {
  approved: 'Approved',
  conditional: 'Conditional',
  'not-approved': 'Not approved',
};

export interface SupplierRow {
  id: number;
  code: string;
  name: string;
  approval: ApprovalStatus;
  notes: string | null;
  contactCount: number;
  partCount: number;
  createdAt: string;
  updatedAt: string;
}

export interface ContactRow {
  id: number;
  name: string;
  email: string;
  phone: string | null;
  duty: string | null;
}

export interface SupplierPartRow {
  id: number;
  supplierPartNumber: string;
  partTypeId: number;
  partNumber: string;
  partDescription: string;
  polarity: Polarity;
  /** Lots received from this supplier under this supplier part number. */
  lotCount: number;
}

export interface SupplierDetail extends SupplierRow {
  contacts: ContactRow[];
  parts: SupplierPartRow[];
}

export interface SupplierInput {
  code: string;
  name: string;
  approval?: ApprovalStatus;
  notes?: string | null;
}

export interface SupplierUpdate {
  code?: string;
  name?: string;
  approval?: ApprovalStatus;
  notes?: string | null;
  /** Why the approval changes; kept as the note of the audit entry. */
  approvalReason?: string;
}

export interface ContactInput {
  name: string;
  email: string;
  phone?: string | null;
  duty?: string | null;
}

export type ContactUpdate = Partial<ContactInput>;

export interface SupplierPartInput {
  supplierPartNumber: string;
  partTypeId: number;
}

export const SUPPLIER_SORTS = ['code', 'name', 'approval', 'updatedAt'] as const;
export type SupplierSort = (typeof SUPPLIER_SORTS)[number];

export interface SupplierListQuery {
  page: number;
  pageSize: number;
  search?: string;
  approval?: ApprovalStatus | '';
  sort?: SupplierSort;
  dir?: 'asc' | 'desc';
}

/** One answer of GET /api/suppliers/part-lookup: a supplier's part number and our part type. */
export interface PartLookupRow {
  mappingId: number;
  supplierPartNumber: string;
  supplier: { id: number; code: string; name: string; approval: ApprovalStatus };
  partType: {
    id: number;
    partNumber: string;
    description: string;
    polarity: Polarity;
    packageName: string;
    msl: MslChoice;
    esdHbmClass: string | null;
    active: boolean;
  };
}
