import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import { SCHEME_LOCKED_CODE, type BinSchemeInput, type BinSchemeVersionRow, type GainBinOut } from '../../../shared/api/catalog.ts';
import type { FieldError } from '../../../shared/api/problem.ts';
import { validateBinScheme, type GainBin, type BinSchemeError } from '../../../shared/domain/binning/index.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { User } from '../users/user.entity.ts';
import { GainBinRow, GainBinSchemeVersion } from './gain-bin-scheme.entity.ts';
import { PartType } from './part-type.entity.ts';

/** validateBinScheme's errors as API field errors: `bins[i].field`, or `bins` for the whole scheme. */
export function schemeFieldErrors(errors: readonly BinSchemeError[]): FieldError[] {
  return errors.map((e) => ({ field: e.index < 0 ? 'bins' : `bins[${e.index}].${e.field}`, message: e.message }));
}

function binOut(b: GainBinRow): GainBinOut {
  return {
    id: b.id,
    position: b.position,
    code: b.code,
    label: b.label,
    hfeMin: b.hfeMin,
    hfeMax: b.hfeMax,
    vbeMinMv: b.vbeMinMv,
    vbeMaxMv: b.vbeMaxMv,
    gapBeforeIntended: b.gapBeforeIntended,
  };
}

const sortedBins = (s: GainBinSchemeVersion) => [...(s.bins ?? [])].sort((a, b) => a.position - b.position);

/** The audit view of a version's bins: compact, in order. */
const binsView = (bins: readonly GainBin[]) =>
  bins.map((b) => ({
    code: b.code,
    label: b.label,
    hfeMin: b.hfeMin,
    hfeMax: b.hfeMax,
    vbeMinMv: b.vbeMinMv ?? null,
    vbeMaxMv: b.vbeMaxMv ?? null,
    gapBeforeIntended: b.gapBeforeIntended ?? false,
  }));

async function lotCounts(m: EntityManager, schemeIds: number[]): Promise<Map<number, number>> {
  if (schemeIds.length === 0) return new Map();
  const rows: { bin_scheme_id: number; n: number }[] = await m.query(
    `SELECT bin_scheme_id, count(*)::int AS n FROM lot WHERE bin_scheme_id = ANY($1) GROUP BY bin_scheme_id`,
    [schemeIds],
  );
  return new Map(rows.map((r) => [r.bin_scheme_id, r.n]));
}

function toRow(s: GainBinSchemeVersion, current: boolean, lotCount: number, createdByName: string | null): BinSchemeVersionRow {
  return {
    id: s.id,
    partTypeId: s.partTypeId,
    version: s.version,
    note: s.note,
    current,
    lockedAt: s.lockedAt ? s.lockedAt.toISOString() : null,
    lotCount,
    locked: s.lockedAt !== null || lotCount > 0,
    createdByName,
    createdAt: s.createdAt.toISOString(),
    bins: sortedBins(s).map(binOut),
  };
}

async function requirePartType(m: EntityManager, partTypeId: number, lock = false): Promise<PartType> {
  const p = await m.findOne(PartType, { where: { id: partTypeId }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
  if (!p) throw AppError.notFound(`Part type ${partTypeId}`);
  return p;
}

/** Every version of a part type's scheme with its bins, newest first. */
export async function listBinSchemes(ds: DataSource, partTypeId: number): Promise<BinSchemeVersionRow[]> {
  await requirePartType(ds.manager, partTypeId);
  const versions = await ds.getRepository(GainBinSchemeVersion).find({
    where: { partTypeId },
    relations: { bins: true },
    order: { version: 'DESC' },
  });
  const counts = await lotCounts(ds.manager, versions.map((v) => v.id));
  const creatorIds = [...new Set(versions.map((v) => v.createdBy).filter((id): id is number => id !== null))];
  const creators = creatorIds.length ? await ds.getRepository(User).createQueryBuilder('u').where('u.id IN (:...ids)', { ids: creatorIds }).getMany() : [];
  const names = new Map(creators.map((u) => [u.id, u.name]));
  return versions.map((v, i) => toRow(v, i === 0, counts.get(v.id) ?? 0, v.createdBy === null ? null : (names.get(v.createdBy) ?? null)));
}

/** The version new lots of the part type use (the highest), or null when it has none. */
export async function getCurrentScheme(m: EntityManager, partTypeId: number): Promise<{ id: number; version: number; bins: GainBin[] } | null> {
  const s = await m.findOne(GainBinSchemeVersion, { where: { partTypeId }, order: { version: 'DESC' }, relations: { bins: true } });
  if (!s) return null;
  return { id: s.id, version: s.version, bins: sortedBins(s).map((b) => binOut(b)) };
}

function checkScheme(part: PartType, input: BinSchemeInput): void {
  const result = validateBinScheme(input.bins, { hfeMin: part.hfeMin, hfeMax: part.hfeMax });
  if (!result.ok) {
    const errors = schemeFieldErrors(result.errors);
    throw AppError.badRequest(`The gain-bin scheme has ${errors.length} problem${errors.length === 1 ? '' : 's'}: check ${[...new Set(errors.map((e) => e.field))].join(', ')}.`, errors);
  }
}

function binEntities(m: EntityManager, schemeId: number, input: BinSchemeInput): GainBinRow[] {
  return input.bins.map((b, position) =>
    m.create(GainBinRow, {
      schemeId,
      position,
      code: b.code,
      label: b.label,
      hfeMin: b.hfeMin,
      hfeMax: b.hfeMax,
      vbeMinMv: b.vbeMinMv ?? null,
      vbeMaxMv: b.vbeMaxMv ?? null,
      gapBeforeIntended: b.gapBeforeIntended ?? false,
    }),
  );
}

async function reload(m: EntityManager, id: number, current: boolean, actor: SessionUser | null): Promise<BinSchemeVersionRow> {
  const s = await m.findOneOrFail(GainBinSchemeVersion, { where: { id }, relations: { bins: true } });
  const counts = await lotCounts(m, [id]);
  return toRow(s, current, counts.get(id) ?? 0, actor?.name ?? null);
}

/** Creates the next version of a part type's scheme after validating it against the part's hFE limits. */
export async function createBinScheme(ds: DataSource, actor: SessionUser, partTypeId: number, input: BinSchemeInput): Promise<BinSchemeVersionRow> {
  return ds.transaction(async (m) => {
    // Locking the part type serialises version numbering between concurrent saves.
    const part = await requirePartType(m, partTypeId, true);
    checkScheme(part, input);
    const [{ max }] = (await m.query(`SELECT coalesce(max(version), 0)::int AS max FROM gain_bin_scheme WHERE part_type_id = $1`, [partTypeId])) as {
      max: number;
    }[];
    const scheme = await m.save(
      m.create(GainBinSchemeVersion, { partTypeId, version: max + 1, note: input.note ?? null, lockedAt: null, createdBy: actor.id }),
    );
    await m.save(binEntities(m, scheme.id, input));
    await recordAudit(m, {
      actor,
      action: 'bin-scheme.create',
      entityType: 'gain-bin-scheme',
      entityId: scheme.id,
      after: { partTypeId, partNumber: part.partNumber, version: scheme.version, note: scheme.note, bins: binsView(input.bins) },
    });
    return reload(m, scheme.id, true, actor);
  });
}

function lockedConflict(version: number, lotCount: number, lockedAt: Date | null): AppError {
  const why = lotCount > 0 ? `${lotCount} lot${lotCount === 1 ? ' uses' : 's use'} it` : `it was locked on ${lockedAt?.toISOString().slice(0, 10)}`;
  return new AppError(409, SCHEME_LOCKED_CODE, `Scheme version ${version} can no longer change because ${why}. Save your bins as a new version instead.`);
}

/**
 * Replaces the bins (and note) of one version, only while no lot uses it and it is not locked;
 * otherwise 409 with code `scheme-locked` (the client offers "save as new version").
 */
export async function updateBinScheme(
  ds: DataSource,
  actor: SessionUser,
  partTypeId: number,
  version: number,
  input: BinSchemeInput,
): Promise<BinSchemeVersionRow> {
  return ds.transaction(async (m) => {
    const part = await requirePartType(m, partTypeId);
    // FOR UPDATE conflicts with the key-share lock a lot insert takes on the version it references,
    // so a lot cannot start using the version between this check and the change.
    const scheme = await m.findOne(GainBinSchemeVersion, { where: { partTypeId, version }, lock: { mode: 'pessimistic_write' } });
    if (!scheme) throw AppError.notFound(`Scheme version ${version} of part type ${partTypeId}`);
    const lotCount = (await lotCounts(m, [scheme.id])).get(scheme.id) ?? 0;
    if (scheme.lockedAt !== null || lotCount > 0) throw lockedConflict(version, lotCount, scheme.lockedAt);
    checkScheme(part, input);
    const old = await m.find(GainBinRow, { where: { schemeId: scheme.id }, order: { position: 'ASC' } });
    await m.delete(GainBinRow, { schemeId: scheme.id });
    await m.save(binEntities(m, scheme.id, input));
    const oldNote = scheme.note;
    if (input.note !== undefined) {
      scheme.note = input.note;
      await m.update(GainBinSchemeVersion, { id: scheme.id }, { note: input.note });
    }
    await recordAudit(m, {
      actor,
      action: 'bin-scheme.update',
      entityType: 'gain-bin-scheme',
      entityId: scheme.id,
      before: { partTypeId, partNumber: part.partNumber, version, note: oldNote, bins: binsView(old) },
      after: { partTypeId, partNumber: part.partNumber, version, note: scheme.note, bins: binsView(input.bins) },
    });
    const [{ max }] = (await m.query(`SELECT max(version)::int AS max FROM gain_bin_scheme WHERE part_type_id = $1`, [partTypeId])) as { max: number }[];
    const creator = scheme.createdBy === null ? null : await m.findOneBy(User, { id: scheme.createdBy });
    const row = await reload(m, scheme.id, max === version, null);
    return { ...row, createdByName: creator?.name ?? null };
  });
}

/**
 * Freezes a scheme version. The lots and bench code calls this, in its own transaction, when a
 * lot starts using the version; from then on its bins never change and an edit makes a new
 * version. Idempotent: returns true when this call locked it, false when it was locked already.
 * (A version a lot references counts as locked even without this call.)
 */
export async function lockSchemeVersion(
  manager: EntityManager,
  schemeId: number,
  opts: { actor?: Pick<SessionUser, 'id' | 'name'> | null; reason?: string } = {},
): Promise<boolean> {
  // TypeORM's query() answers an UPDATE with [rows, affected count].
  const [rows] = (await manager.query(
    `UPDATE gain_bin_scheme SET locked_at = now() WHERE id = $1 AND locked_at IS NULL RETURNING id, part_type_id, version`,
    [schemeId],
  )) as [{ id: number; part_type_id: number; version: number }[], number];
  const locked = rows[0];
  if (!locked) {
    const exists = await manager.findOneBy(GainBinSchemeVersion, { id: schemeId });
    if (!exists) throw AppError.notFound(`Gain-bin scheme ${schemeId}`);
    return false;
  }
  await recordAudit(manager, {
    actor: opts.actor ?? null,
    action: 'bin-scheme.lock',
    entityType: 'gain-bin-scheme',
    entityId: schemeId,
    after: { partTypeId: locked.part_type_id, version: locked.version, locked: true },
    note: opts.reason ?? null,
  });
  return true;
}
