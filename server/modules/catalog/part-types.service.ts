import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import {
  PART_TYPE_DEFAULTS,
  type MslChoice,
  type PartTypeDetail,
  type PartTypeInput,
  type PartTypeRow,
  type PartTypeSort,
  type PartTypeUpdate,
  type Polarity,
} from '../../../shared/api/catalog.ts';
import type { FieldError } from '../../../shared/api/problem.ts';
import type { Page } from '../../../shared/api/users.ts';
import { validateBinScheme } from '../../../shared/domain/binning/index.ts';
import { aqlsForMethod, type SamplingMethod } from '../../../shared/domain/sampling/index.ts';
import { AppError } from '../../http/app-error.ts';
import { isUniqueViolation, likePattern } from '../../http/route-params.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { GainBinSchemeVersion } from './gain-bin-scheme.entity.ts';
import { PartType } from './part-type.entity.ts';

/** The fields a client may write, in form order; also the audit view of a part type. */
const WRITABLE = [
  'partNumber',
  'description',
  'polarity',
  'packageName',
  'hfeIcMa',
  'hfeVceV',
  'vbeIcMa',
  'hfeMin',
  'hfeMax',
  'vbeMinMv',
  'vbeMaxMv',
  'vbeTcMvPerC',
  'hfeTcPctPerC',
  'msl',
  'esdHbmClass',
  'samplingMethod',
  'inspectionLevel',
  'aql',
  'matchHfePct',
  'matchVbeMv',
  'active',
] as const satisfies readonly (keyof PartTypeInput & keyof PartType)[];

type Writable = Pick<PartType, (typeof WRITABLE)[number]>;

function auditView(p: Writable): Record<string, unknown> {
  return Object.fromEntries(WRITABLE.map((k) => [k, p[k]]));
}

export function toPartTypeRow(p: PartType, currentSchemeVersion: number | null): PartTypeRow {
  return {
    id: p.id,
    partNumber: p.partNumber,
    description: p.description,
    polarity: p.polarity,
    packageName: p.packageName,
    hfeIcMa: p.hfeIcMa,
    hfeVceV: p.hfeVceV,
    vbeIcMa: p.vbeIcMa,
    hfeMin: p.hfeMin,
    hfeMax: p.hfeMax,
    vbeMinMv: p.vbeMinMv,
    vbeMaxMv: p.vbeMaxMv,
    vbeTcMvPerC: p.vbeTcMvPerC,
    hfeTcPctPerC: p.hfeTcPctPerC,
    msl: p.msl as MslChoice,
    esdHbmClass: p.esdHbmClass,
    samplingMethod: p.samplingMethod,
    inspectionLevel: p.inspectionLevel,
    aql: p.aql,
    matchHfePct: p.matchHfePct,
    matchVbeMv: p.matchVbeMv,
    active: p.active,
    currentSchemeVersion,
    createdAt: p.createdAt.toISOString(),
    updatedAt: p.updatedAt.toISOString(),
  };
}

/**
 * Rules across fields that a DTO cannot express: min below max for hFE and Vbe, and an AQL
 * the sampling method has a plan for. Field errors name the field to fix.
 */
export function partTypeRuleErrors(p: Writable): FieldError[] {
  const errors: FieldError[] = [];
  if (p.hfeMin !== null && p.hfeMax !== null && p.hfeMin >= p.hfeMax) {
    errors.push({ field: 'hfeMax', message: `hfeMax must be greater than hfeMin (${p.hfeMin})` });
  }
  if (p.vbeMinMv !== null && p.vbeMaxMv !== null && p.vbeMinMv >= p.vbeMaxMv) {
    errors.push({ field: 'vbeMaxMv', message: `vbeMaxMv must be greater than vbeMinMv (${p.vbeMinMv} mV)` });
  }
  const aqls = aqlsForMethod(p.samplingMethod as SamplingMethod);
  if (!aqls.includes(p.aql)) {
    errors.push({ field: 'aql', message: `aql ${p.aql} % has no ${p.samplingMethod} plan; choose one of ${aqls.join(', ')}` });
  }
  return errors;
}

const SORT_COLUMNS: Record<PartTypeSort, string> = {
  partNumber: 'p.partNumber',
  description: 'p.description',
  polarity: 'p.polarity',
  packageName: 'p.packageName',
  hfeIcMa: 'p.hfeIcMa',
  hfeMin: 'p.hfeMin',
  hfeMax: 'p.hfeMax',
  vbeMinMv: 'p.vbeMinMv',
  vbeMaxMv: 'p.vbeMaxMv',
  msl: 'p.msl',
  esdHbmClass: 'p.esdHbmClass',
  samplingMethod: 'p.samplingMethod',
  aql: 'p.aql',
  active: 'p.active',
  updatedAt: 'p.updatedAt',
};

export interface PartTypeListOptions {
  page: number;
  pageSize: number;
  search?: string;
  polarity?: Polarity;
  packageName?: string;
  active?: boolean;
  sort?: PartTypeSort;
  dir?: 'asc' | 'desc';
}

async function currentVersions(m: EntityManager, ids: number[]): Promise<Map<number, number>> {
  if (ids.length === 0) return new Map();
  const rows: { part_type_id: number; version: number }[] = await m.query(
    `SELECT part_type_id, max(version)::int AS version FROM gain_bin_scheme WHERE part_type_id = ANY($1) GROUP BY part_type_id`,
    [ids],
  );
  return new Map(rows.map((r) => [r.part_type_id, r.version]));
}

export async function listPartTypes(ds: DataSource, q: PartTypeListOptions): Promise<Page<PartTypeRow>> {
  const qb = ds.getRepository(PartType).createQueryBuilder('p');
  if (q.search) qb.andWhere('(p.partNumber ILIKE :s OR p.description ILIKE :s)', { s: likePattern(q.search) });
  if (q.polarity) qb.andWhere('p.polarity = :polarity', { polarity: q.polarity });
  if (q.packageName) qb.andWhere('lower(p.packageName) = lower(:pkg)', { pkg: q.packageName });
  if (q.active !== undefined) qb.andWhere('p.active = :active', { active: q.active });
  const dir = (q.dir ?? 'asc').toUpperCase() as 'ASC' | 'DESC';
  qb.orderBy(SORT_COLUMNS[q.sort ?? 'partNumber'], dir, dir === 'ASC' ? 'NULLS LAST' : 'NULLS FIRST').addOrderBy('p.id', 'ASC');
  const [rows, total] = await qb.skip((q.page - 1) * q.pageSize).take(q.pageSize).getManyAndCount();
  const versions = await currentVersions(ds.manager, rows.map((r) => r.id));
  return { items: rows.map((r) => toPartTypeRow(r, versions.get(r.id) ?? null)), total, page: q.page, pageSize: q.pageSize };
}

/** The distinct package names in the catalog, for the list filter. */
export async function listPackages(ds: DataSource): Promise<string[]> {
  const rows: { package: string }[] = await ds.query(`SELECT DISTINCT package FROM part_type ORDER BY package`);
  return rows.map((r) => r.package);
}

export async function getPartType(ds: DataSource, id: number): Promise<PartTypeDetail> {
  const p = await ds.getRepository(PartType).findOneBy({ id });
  if (!p) throw AppError.notFound(`Part type ${id}`);
  const versions = await currentVersions(ds.manager, [id]);
  const suppliers: {
    mapping_id: number;
    supplier_id: number;
    code: string;
    name: string;
    approval: PartTypeDetail['suppliers'][number]['approval'];
    supplier_part_number: string;
  }[] = await ds.query(
    `SELECT sp.id AS mapping_id, s.id AS supplier_id, s.code, s.name, s.approval, sp.supplier_part_number
       FROM supplier_part sp JOIN supplier s ON s.id = sp.supplier_id
      WHERE sp.part_type_id = $1 ORDER BY s.name, sp.supplier_part_number`,
    [id],
  );
  return {
    ...toPartTypeRow(p, versions.get(id) ?? null),
    suppliers: suppliers.map((s) => ({
      mappingId: s.mapping_id,
      supplierId: s.supplier_id,
      supplierCode: s.code,
      supplierName: s.name,
      approval: s.approval,
      supplierPartNumber: s.supplier_part_number,
    })),
  };
}

function duplicatePartNumber(partNumber: string): AppError {
  return AppError.conflict(`Part number ${partNumber} is already in the catalog.`, [
    { field: 'partNumber', message: `part number ${partNumber} is already in the catalog` },
  ]);
}

async function assertPartNumberFree(m: EntityManager, partNumber: string, exceptId?: number): Promise<void> {
  const qb = m.getRepository(PartType).createQueryBuilder('p').where('lower(p.partNumber) = lower(:pn)', { pn: partNumber });
  if (exceptId !== undefined) qb.andWhere('p.id <> :id', { id: exceptId });
  if (await qb.getExists()) throw duplicatePartNumber(partNumber);
}

function assertRules(p: Writable): void {
  const errors = partTypeRuleErrors(p);
  if (errors.length) throw AppError.badRequest(`Check ${errors.map((e) => e.field).join(', ')}.`, errors);
}

async function saveMapped<T>(partNumber: string, work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (e) {
    if (isUniqueViolation(e)) throw duplicatePartNumber(partNumber);
    throw e;
  }
}

export async function createPartType(ds: DataSource, actor: SessionUser, input: PartTypeInput): Promise<PartTypeRow> {
  const values: Writable = {
    partNumber: input.partNumber,
    description: input.description,
    polarity: input.polarity,
    packageName: input.packageName,
    hfeIcMa: input.hfeIcMa,
    hfeVceV: input.hfeVceV,
    vbeIcMa: input.vbeIcMa,
    hfeMin: input.hfeMin ?? null,
    hfeMax: input.hfeMax ?? null,
    vbeMinMv: input.vbeMinMv ?? null,
    vbeMaxMv: input.vbeMaxMv ?? null,
    vbeTcMvPerC: input.vbeTcMvPerC ?? PART_TYPE_DEFAULTS.vbeTcMvPerC,
    hfeTcPctPerC: input.hfeTcPctPerC ?? PART_TYPE_DEFAULTS.hfeTcPctPerC,
    msl: input.msl,
    esdHbmClass: input.esdHbmClass ?? null,
    samplingMethod: input.samplingMethod ?? PART_TYPE_DEFAULTS.samplingMethod,
    inspectionLevel: input.inspectionLevel ?? PART_TYPE_DEFAULTS.inspectionLevel,
    aql: input.aql ?? PART_TYPE_DEFAULTS.aql,
    matchHfePct: input.matchHfePct ?? PART_TYPE_DEFAULTS.matchHfePct,
    matchVbeMv: input.matchVbeMv ?? PART_TYPE_DEFAULTS.matchVbeMv,
    active: input.active ?? true,
  };
  assertRules(values);
  return saveMapped(values.partNumber, () =>
    ds.transaction(async (m) => {
      await assertPartNumberFree(m, values.partNumber);
      const saved = await m.save(m.create(PartType, values));
      await recordAudit(m, { actor, action: 'part-type.create', entityType: 'part-type', entityId: saved.id, after: auditView(saved) });
      return toPartTypeRow(saved, null);
    }),
  );
}

/**
 * Changes a part type. New hFE limits must still hold the current gain-bin scheme; otherwise
 * the answer is 409 and the engineer first saves a scheme version inside the new limits.
 */
export async function updatePartType(ds: DataSource, actor: SessionUser, id: number, input: PartTypeUpdate): Promise<PartTypeRow> {
  return saveMapped(input.partNumber ?? '', () =>
    ds.transaction(async (m) => {
      const p = await m.findOne(PartType, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!p) throw AppError.notFound(`Part type ${id}`);
      const before = auditView(p);
      const next = { ...p } as Writable;
      for (const k of WRITABLE) {
        const v = input[k];
        if (v !== undefined) (next as Record<string, unknown>)[k] = v;
      }
      assertRules(next);
      if (input.partNumber !== undefined && input.partNumber !== p.partNumber) await assertPartNumberFree(m, input.partNumber, id);

      const changed = WRITABLE.filter((k) => before[k] !== next[k]);
      const versions = await currentVersions(m, [id]);
      if (changed.length === 0) return toPartTypeRow(p, versions.get(id) ?? null);

      if (changed.includes('hfeMin') || changed.includes('hfeMax')) {
        const current = await m.findOne(GainBinSchemeVersion, {
          where: { partTypeId: id },
          order: { version: 'DESC' },
          relations: { bins: true },
        });
        if (current?.bins?.length) {
          const bins = [...current.bins].sort((a, b) => a.position - b.position);
          const outside = validateBinScheme(bins, { hfeMin: next.hfeMin, hfeMax: next.hfeMax }).errors.filter((e) =>
            /part's (minimum|maximum) hFE/.test(e.message),
          );
          if (outside.length) {
            const fields = [...new Set(outside.map((e) => e.field))];
            throw AppError.conflict(
              `Gain-bin scheme version ${current.version} has bins outside these hFE limits. Save a scheme version inside the new limits first.`,
              fields.map((f) => ({
                field: f,
                message: `bins of scheme version ${current.version} lie outside this limit: ${outside.filter((e) => e.field === f).map((e) => `bin ${bins[e.index]?.code}`).join(', ')}`,
              })),
            );
          }
        }
      }

      Object.assign(p, next);
      const saved = await m.save(p);
      await recordAudit(m, {
        actor,
        action: 'part-type.update',
        entityType: 'part-type',
        entityId: id,
        before: Object.fromEntries(changed.map((k) => [k, before[k]])),
        after: Object.fromEntries(changed.map((k) => [k, next[k]])),
      });
      return toPartTypeRow(saved, versions.get(id) ?? null);
    }),
  );
}
