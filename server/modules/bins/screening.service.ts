import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import {
  DEFAULT_SCREENING_SETUP,
  OUTSIDE_BINS_LABEL,
  type ContainerBin,
  type LotScreening,
  type PartPlacement,
  type PlaceScreenedResponse,
  type RecentPlacementsResponse,
  type ScreeningSetup,
} from '../../../shared/api/bins.ts';
import { assignBin, binCounts, type GainBin } from '../../../shared/domain/binning/index.ts';
import { planPlacements, statusAfter, type ContainerState, type ContainerStatus } from '../../../shared/domain/screening/index.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { benchWorkOf } from '../bench/lot-context.ts';
import { getCurrentScheme, lockSchemeVersion } from '../catalog/bin-schemes.service.ts';
import { nextContainerCodes } from './container-code.ts';
import { CONTAINER_SELECT, toContainerBin, toContainerRow, type ContainerSqlRow } from './container-view.ts';
import type { LotStatus } from '../lots/lot.entity.ts';
import { insertMovement } from './containers.service.ts';

/** A current reading of a screened part, values referred to 25 °C (what the bins are defined at). */
export interface ScreenedReading {
  id: string;
  /** Part position in the lot. */
  position: number;
  hfe25: number;
  vbeMv25: number;
  supersedesId: string | null;
}

interface SchemeBin extends GainBin {
  id: number;
  index: number;
}

export interface LotScheme {
  id: number;
  version: number;
  lockedAt: Date | null;
  bins: SchemeBin[];
}

interface LotRowLite {
  id: number;
  code: string;
  part_type_id: number;
  bin_scheme_id: number | null;
}

async function loadScheme(m: EntityManager, schemeId: number): Promise<LotScheme> {
  const [s] = (await m.query(`SELECT id, version, locked_at FROM gain_bin_scheme WHERE id = $1`, [schemeId])) as { id: number; version: number; locked_at: Date | null }[];
  const bins = (await m.query(
    `SELECT id, position, code, label, hfe_min, hfe_max, vbe_min_mv, vbe_max_mv FROM gain_bin WHERE scheme_id = $1 ORDER BY position`,
    [schemeId],
  )) as { id: number; position: number; code: string; label: string; hfe_min: number; hfe_max: number; vbe_min_mv: number | null; vbe_max_mv: number | null }[];
  return {
    id: s.id,
    version: s.version,
    lockedAt: s.locked_at,
    bins: bins.map((b, index) => ({ id: b.id, index, code: b.code, label: b.label, hfeMin: b.hfe_min, hfeMax: b.hfe_max, vbeMinMv: b.vbe_min_mv, vbeMaxMv: b.vbe_max_mv })),
  };
}

async function lockLot(m: EntityManager, lotId: number): Promise<LotRowLite> {
  const rows = (await m.query(`SELECT id, code, part_type_id, bin_scheme_id FROM lot WHERE id = $1 FOR UPDATE`, [lotId])) as LotRowLite[];
  if (!rows[0]) throw AppError.notFound(`Lot ${lotId}`);
  return rows[0];
}

/**
 * The gain-bin scheme version a lot is screened by. The first time, the part type's current
 * version is tied to the lot and locked (Catalog's lockSchemeVersion), both audited, so the bins
 * never change under a lot being screened. 409 when the part type has no scheme.
 */
export async function ensureLotScheme(m: EntityManager, actor: Pick<SessionUser, 'id' | 'name'>, lot: LotRowLite): Promise<LotScheme> {
  let schemeId = lot.bin_scheme_id;
  if (schemeId === null) {
    const current = await getCurrentScheme(m, lot.part_type_id);
    if (!current) {
      throw AppError.conflict(`Lot ${lot.code} cannot be screened: its part type has no gain-bin scheme yet. A quality engineer adds one in Catalog.`);
    }
    schemeId = current.id;
    await m.query(`UPDATE lot SET bin_scheme_id = $2, updated_at = now() WHERE id = $1`, [lot.id, schemeId]);
    await recordAudit(m, { actor, action: 'lot.bin-scheme', entityType: 'lot', entityId: lot.id, before: { binSchemeId: null }, after: { binSchemeId: schemeId, version: current.version } });
    lot.bin_scheme_id = schemeId;
  }
  await lockSchemeVersion(m, schemeId, { actor, reason: `screening of lot ${lot.code}` });
  return loadScheme(m, schemeId);
}

export async function loadSetup(m: EntityManager, lotId: number): Promise<ScreeningSetup> {
  const rows = (await m.query(`SELECT kind, capacity, has_positions, location FROM screening_setup WHERE lot_id = $1`, [lotId])) as {
    kind: ScreeningSetup['kind'];
    capacity: number;
    has_positions: boolean;
    location: string;
  }[];
  const r = rows[0];
  return r ? { kind: r.kind, capacity: r.capacity, hasPositions: r.has_positions, location: r.location } : { ...DEFAULT_SCREENING_SETUP };
}

function binOf(scheme: LotScheme, code: string | null): ContainerBin {
  const b = code === null ? null : scheme.bins.find((x) => x.code === code);
  return {
    code: b ? b.code : null,
    label: b ? b.label : OUTSIDE_BINS_LABEL,
    hfeMin: b ? b.hfeMin : null,
    hfeMax: b ? b.hfeMax : null,
    index: b ? b.index : null,
    isLast: b ? b.index === scheme.bins.length - 1 : false,
    schemeId: scheme.id,
    schemeVersion: scheme.version,
  };
}

interface OpenRow {
  id: number;
  code: string;
  bin_code: string | null;
  capacity: number;
  has_positions: boolean;
  status: ContainerStatus;
  quantity: number;
  location: string;
}

/**
 * Places screened parts of a lot into containers, in the caller's transaction (so a reading and
 * its place commit together): each part gets its bin of the lot's locked scheme version (or
 * "outside all bins"), the first open container of that bin with room and its next free
 * position (shared/domain/screening planPlacements); a full container is followed by a new one
 * opened with the lot's screening set-up. Idempotent: a reading already placed is reported, not
 * placed again (a unique index on the screen-in movement guards it even under a race). A
 * corrected reading takes its predecessor's place when the bin is the same; otherwise the old
 * place is freed ("rebinned") and the part placed in its new bin.
 */
export async function placeScreenedParts(
  m: EntityManager,
  actor: Pick<SessionUser, 'id' | 'name'>,
  lotId: number,
  readings: readonly ScreenedReading[],
): Promise<PlaceScreenedResponse> {
  const lot = await lockLot(m, lotId);
  if (readings.length === 0) return { placed: 0, alreadyPlaced: 0, containersOpened: 0, placements: [] };
  const scheme = await ensureLotScheme(m, actor, lot);
  const setup = await loadSetup(m, lotId);
  const result = new Map<string, PartPlacement>();

  // 1. Readings placed before.
  const done = (await m.query(
    `SELECT sm.measurement_id, sm.container_id, c.code, c.bin_code, cp.position
       FROM stock_movement sm JOIN container c ON c.id = sm.container_id
       LEFT JOIN container_position cp ON cp.measurement_id = sm.measurement_id
      WHERE sm.kind = 'screen-in' AND sm.measurement_id = ANY($1::bigint[])`,
    [readings.map((r) => r.id)],
  )) as { measurement_id: string; container_id: number; code: string; bin_code: string | null; position: number | null }[];
  for (const d of done) {
    const r = readings.find((x) => x.id === String(d.measurement_id));
    if (!r) continue;
    result.set(r.id, {
      measurementId: r.id,
      lotPosition: r.position,
      bin: binOf(scheme, d.bin_code),
      containerId: d.container_id,
      containerCode: d.code,
      position: d.position,
      openedContainer: false,
      filledContainer: false,
      alreadyPlaced: true,
    });
  }

  // 2. Corrections of placed readings.
  const fresh: ScreenedReading[] = [];
  const corrections = readings.filter((r) => !result.has(r.id) && r.supersedesId !== null);
  const predecessors = corrections.length
    ? ((await m.query(
        `SELECT sm.measurement_id, c.id AS container_id, c.code, c.bin_code, c.has_positions, c.quantity, c.status, c.capacity,
                cp.id AS cp_id, cp.position, cp.state
           FROM stock_movement sm JOIN container c ON c.id = sm.container_id
           LEFT JOIN container_position cp ON cp.measurement_id = sm.measurement_id
          WHERE sm.kind = 'screen-in' AND sm.measurement_id = ANY($1::bigint[])
          ORDER BY c.id FOR UPDATE OF c`,
        [corrections.map((r) => r.supersedesId)],
      )) as {
        measurement_id: string;
        container_id: number;
        code: string;
        bin_code: string | null;
        has_positions: boolean;
        quantity: number;
        status: ContainerStatus;
        capacity: number;
        cp_id: string | null;
        position: number | null;
        state: string | null;
      }[])
    : [];
  for (const r of readings) {
    if (result.has(r.id)) continue;
    const prev = r.supersedesId === null ? undefined : predecessors.find((p) => String(p.measurement_id) === String(r.supersedesId));
    if (!prev) {
      fresh.push(r);
      continue;
    }
    const bin = assignBin(scheme.bins, { hfe: r.hfe25, vbeMv: r.vbeMv25 });
    const inStock = prev.has_positions ? prev.state === 'in-stock' || prev.state === 'reserved' : prev.quantity > 0;
    if (bin === prev.bin_code || !inStock || prev.state === 'reserved') {
      // Same bin (or the part is no longer free to move): the corrected reading takes the old place.
      if (prev.cp_id !== null && inStock) await m.query(`UPDATE container_position SET measurement_id = $2 WHERE id = $1`, [prev.cp_id, r.id]);
      await insertMovement(m, prev.container_id, actor, {
        kind: 'screen-in',
        delta: 0,
        after: prev.quantity,
        positions: prev.position === null ? null : [prev.position],
        measurementId: r.id,
        reason: bin === prev.bin_code ? `reading corrected (#${prev.measurement_id}); same bin` : `reading corrected (#${prev.measurement_id}); part not free to move`,
      });
      result.set(r.id, {
        measurementId: r.id,
        lotPosition: r.position,
        bin: binOf(scheme, prev.bin_code),
        containerId: prev.container_id,
        containerCode: prev.code,
        position: inStock ? prev.position : null,
        openedContainer: false,
        filledContainer: false,
        alreadyPlaced: false,
      });
      continue;
    }
    // Another bin: free the old place, then place the part like a new one.
    const quantity = prev.quantity - 1;
    if (prev.cp_id !== null) await m.query(`UPDATE container_position SET state = 'rebinned', state_changed_at = now() WHERE id = $1`, [prev.cp_id]);
    const status = statusAfter(prev.status, quantity, prev.capacity);
    await m.query(`UPDATE container SET quantity = $2, status = $3, version = version + 1, updated_at = now() WHERE id = $1`, [prev.container_id, quantity, status]);
    prev.quantity = quantity;
    prev.status = status;
    await insertMovement(m, prev.container_id, actor, {
      kind: 'adjust',
      delta: -1,
      after: quantity,
      positions: prev.position === null ? null : [prev.position],
      reason: `re-binned: reading corrected (#${prev.measurement_id} → #${r.id}), now ${bin ?? 'outside all bins'}`,
    });
    await recordAudit(m, {
      actor,
      action: 'container.rebin-out',
      entityType: 'container',
      entityId: prev.container_id,
      before: { quantity: quantity + 1, measurementId: String(prev.measurement_id), position: prev.position },
      after: { quantity, status, newMeasurementId: r.id, newBin: bin },
    });
    fresh.push(r);
  }

  // 3. New places.
  let opened = 0;
  if (fresh.length) {
    const open = (await m.query(
      `SELECT id, code, bin_code, capacity, has_positions, status, quantity, location FROM container
        WHERE lot_id = $1 AND bin_scheme_id = $2 AND status = 'open' ORDER BY id FOR UPDATE`,
      [lotId, scheme.id],
    )) as OpenRow[];
    const occupiedRows = open.length
      ? ((await m.query(
          `SELECT container_id, array_agg(position) AS positions FROM container_position
            WHERE container_id = ANY($1) AND state IN ('in-stock','reserved') GROUP BY container_id`,
          [open.map((c) => c.id)],
        )) as { container_id: number; positions: number[] }[])
      : [];
    const occupied = new Map(occupiedRows.map((r) => [r.container_id, r.positions]));
    const states: ContainerState[] = open.map((c) => ({
      id: c.id,
      binCode: c.bin_code,
      capacity: c.capacity,
      hasPositions: c.has_positions,
      status: c.status,
      quantity: c.quantity,
      occupied: occupied.get(c.id) ?? [],
    }));
    const plan = planPlacements(
      scheme.bins,
      fresh.map((r) => ({ hfe: r.hfe25, vbeMv: r.vbeMv25 })),
      states,
      { capacity: setup.capacity, hasPositions: setup.hasPositions },
    );

    // Open the new containers, in the order the plan needs them.
    const newBins = new Map<number, string | null>();
    for (const p of plan) if (!p.container.existing && !newBins.has(p.container.newIndex)) newBins.set(p.container.newIndex, p.bin);
    const newIds = new Map<number, { id: number; code: string }>();
    if (newBins.size) {
      const now = new Date();
      const codes = await nextContainerCodes(m, now, newBins.size);
      const idx = [...newBins.keys()].sort((a, b) => a - b);
      const binIds = idx.map((i) => {
        const code = newBins.get(i) ?? null;
        return code === null ? null : (scheme.bins.find((b) => b.code === code)?.id ?? null);
      });
      const created = (await m.query(
        `INSERT INTO container (code, lot_id, part_type_id, bin_scheme_id, gain_bin_id, bin_code, kind, capacity, has_positions, quantity, location, status, created_by)
         SELECT t.code, $2, $3, $4, t.bin_id, t.bin_code, $5, $6, $7, 0, $8, 'open', $9
           FROM unnest($1::text[], $10::int[], $11::text[]) WITH ORDINALITY AS t(code, bin_id, bin_code, n)
          ORDER BY t.n
         RETURNING id, code`,
        [codes, lotId, lot.part_type_id, scheme.id, setup.kind, setup.capacity, setup.hasPositions, setup.location, actor.id, binIds, idx.map((i) => newBins.get(i) ?? null)],
      )) as { id: number; code: string }[];
      const byCode = new Map(created.map((c) => [c.code, c.id]));
      idx.forEach((i, k) => newIds.set(i, { id: byCode.get(codes[k]) as number, code: codes[k] }));
      for (const [i, c] of newIds) {
        await recordAudit(m, {
          actor,
          action: 'container.open',
          entityType: 'container',
          entityId: c.id,
          after: { code: c.code, lotId, lotCode: lot.code, bin: newBins.get(i) ?? null, schemeVersion: scheme.version, ...setup },
        });
      }
      opened = newIds.size;
    }

    const byId = new Map(open.map((c) => [c.id, c]));
    const running = new Map<number, { quantity: number; capacity: number; status: ContainerStatus; code: string }>();
    for (const c of open) running.set(c.id, { quantity: c.quantity, capacity: c.capacity, status: c.status, code: c.code });
    for (const c of newIds.values()) running.set(c.id, { quantity: 0, capacity: setup.capacity, status: 'open', code: c.code });
    const seenNew = new Set<number>();
    const pos = { c: [] as number[], p: [] as number[], mid: [] as string[] };
    const mv = { c: [] as number[], after: [] as number[], p: [] as (number | null)[], mid: [] as string[], loc: [] as string[] };
    plan.forEach((p, i) => {
      const r = fresh[i] as ScreenedReading;
      const target = p.container.existing ? { id: Number(p.container.id), code: byId.get(Number(p.container.id))?.code ?? '' } : (newIds.get(p.container.newIndex) as { id: number; code: string });
      const run = running.get(target.id) as { quantity: number; capacity: number; status: ContainerStatus; code: string };
      run.quantity++;
      if (p.position !== null) {
        pos.c.push(target.id);
        pos.p.push(p.position);
        pos.mid.push(r.id);
      }
      mv.c.push(target.id);
      mv.after.push(run.quantity);
      mv.p.push(p.position);
      mv.mid.push(r.id);
      mv.loc.push(byId.get(target.id)?.location ?? setup.location);
      const openedHere = !p.container.existing && !seenNew.has(target.id);
      if (openedHere) seenNew.add(target.id);
      result.set(r.id, {
        measurementId: r.id,
        lotPosition: r.position,
        bin: binOf(scheme, p.bin),
        containerId: target.id,
        containerCode: target.code,
        position: p.position,
        openedContainer: openedHere,
        filledContainer: p.fillsContainer,
        alreadyPlaced: false,
      });
    });
    if (pos.c.length) {
      await m.query(
        `INSERT INTO container_position (container_id, position, measurement_id) SELECT * FROM unnest($1::int[], $2::int[], $3::bigint[])`,
        [pos.c, pos.p, pos.mid],
      );
    }
    await m.query(
      `INSERT INTO stock_movement (container_id, kind, quantity_delta, quantity_after, to_location, positions, measurement_id, user_id)
       SELECT t.c, 'screen-in', 1, t.after, t.loc, CASE WHEN t.p IS NULL THEN NULL ELSE ARRAY[t.p] END, t.mid, $6
         FROM unnest($1::int[], $2::int[], $3::int[], $4::bigint[], $5::text[]) AS t(c, after, p, mid, loc)`,
      [mv.c, mv.after, mv.p, mv.mid, mv.loc, actor.id],
    );
    const touched = [...new Set(mv.c)];
    const finals = touched.map((id) => {
      const run = running.get(id) as { quantity: number; capacity: number; status: ContainerStatus };
      return { id, quantity: run.quantity, status: statusAfter(run.status, run.quantity, run.capacity) };
    });
    await m.query(
      `UPDATE container c SET quantity = t.q, status = t.s, version = c.version + 1, updated_at = now()
         FROM unnest($1::int[], $2::int[], $3::text[]) AS t(id, q, s) WHERE c.id = t.id`,
      [finals.map((f) => f.id), finals.map((f) => f.quantity), finals.map((f) => f.status)],
    );
  }

  const placements = readings.map((r) => result.get(r.id) as PartPlacement);
  const placed = placements.filter((p) => !p.alreadyPlaced).length;
  if (placed) {
    const perBin = new Map<string, number>();
    for (const p of placements) if (!p.alreadyPlaced) perBin.set(p.bin.code ?? 'outside', (perBin.get(p.bin.code ?? 'outside') ?? 0) + 1);
    await recordAudit(m, {
      actor,
      action: 'screening.place',
      entityType: 'lot',
      entityId: lotId,
      after: { placed, containersOpened: opened, schemeVersion: scheme.version, perBin: Object.fromEntries(perBin) },
    });
  }
  return { placed, alreadyPlaced: placements.length - placed, containersOpened: opened, placements };
}

/** One screened part: see placeScreenedParts. Call it in the transaction that records the reading. */
export async function placeScreenedPart(
  m: EntityManager,
  actor: Pick<SessionUser, 'id' | 'name'>,
  lotId: number,
  reading: ScreenedReading,
): Promise<PartPlacement> {
  const r = await placeScreenedParts(m, actor, lotId, [reading]);
  return r.placements[0] as PartPlacement;
}

interface ReadingRow {
  id: string;
  position: number;
  hfe_25: number;
  vbe_mv_25: number;
  supersedes_id: string | null;
}

const toReading = (r: ReadingRow): ScreenedReading => ({ id: String(r.id), position: r.position, hfe25: r.hfe_25, vbeMv25: r.vbe_mv_25, supersedesId: r.supersedes_id === null ? null : String(r.supersedes_id) });

/**
 * Places the lot's current screening readings (and, when asked, its sample readings) that have
 * no place yet, in the order they were recorded, in the caller's transaction. Used after a
 * tester import in a screening session and by POST /api/lots/:id/screening/place.
 */
export async function placeUnplacedReadings(
  m: EntityManager,
  actor: Pick<SessionUser, 'id' | 'name'>,
  lotId: number,
  includeSample = false,
): Promise<PlaceScreenedResponse> {
  await lockLot(m, lotId);
  const rows = (await m.query(
    `SELECT me.id, me.position, me.hfe_25, me.vbe_mv_25, me.supersedes_id
       FROM measurement me JOIN measurement_session s ON s.id = me.session_id
      WHERE me.lot_id = $1 AND NOT me.superseded AND (s.mode = 'screen' OR $2)
        AND NOT EXISTS (SELECT 1 FROM stock_movement sm WHERE sm.kind = 'screen-in' AND sm.measurement_id = me.id)
      ORDER BY me.id`,
    [lotId, includeSample],
  )) as ReadingRow[];
  return placeScreenedParts(m, actor, lotId, rows.map(toReading));
}

/** POST /api/lots/:id/screening/place */
export async function placeUnplaced(ds: DataSource, actor: SessionUser, lotId: number, includeSample: boolean): Promise<PlaceScreenedResponse> {
  return ds.transaction((m) => placeUnplacedReadings(m, actor, lotId, includeSample));
}

/**
 * The bench's hook, called in the transaction that records a reading: a reading of a screening
 * session — or a correction of a part already placed — gets its bin, container and position.
 * Returns null for a sample reading.
 */
export async function placeRecordedReading(
  m: EntityManager,
  actor: Pick<SessionUser, 'id' | 'name'>,
  session: { lotId: number; mode: string },
  saved: { id: string; position: number; hfe25: number; vbeMv25: number; supersedesId: string | null },
): Promise<PartPlacement | null> {
  let screening = session.mode === 'screen';
  if (!screening && saved.supersedesId !== null) {
    const rows = (await m.query(`SELECT 1 FROM stock_movement WHERE kind = 'screen-in' AND measurement_id = $1`, [saved.supersedesId])) as unknown[];
    screening = rows.length > 0;
  }
  if (!screening) return null;
  return placeScreenedPart(m, actor, session.lotId, {
    id: String(saved.id),
    position: saved.position,
    hfe25: saved.hfe25,
    vbeMv25: saved.vbeMv25,
    supersedesId: saved.supersedesId === null ? null : String(saved.supersedesId),
  });
}

/**
 * Refuses (409 naming `mode`) to start a screening session on a lot that cannot be binned: its
 * part type has no gain-bin scheme and none is tied to the lot.
 */
export async function assertScreenable(m: EntityManager, lot: { id: number; code: string; partTypeId: number; binSchemeId: number | null }): Promise<void> {
  if (lot.binSchemeId !== null) return;
  if (await getCurrentScheme(m, lot.partTypeId)) return;
  throw AppError.conflict(`Lot ${lot.code} cannot be screened into bins: its part type has no gain-bin scheme yet. A quality engineer adds one in Catalog; until then, measure a sample.`, [
    { field: 'mode', message: 'no gain-bin scheme for this part type' },
  ]);
}

/** PUT /api/lots/:id/screening/setup: how screening opens new containers for the lot. */
export async function saveSetup(ds: DataSource, actor: SessionUser, lotId: number, input: ScreeningSetup): Promise<ScreeningSetup> {
  return ds.transaction(async (m) => {
    await lockLot(m, lotId);
    const before = await loadSetup(m, lotId);
    const after: ScreeningSetup = { kind: input.kind, capacity: input.capacity, hasPositions: input.hasPositions, location: input.location.trim() };
    await m.query(
      `INSERT INTO screening_setup (lot_id, kind, capacity, has_positions, location, updated_by, updated_at) VALUES ($1, $2, $3, $4, $5, $6, now())
       ON CONFLICT (lot_id) DO UPDATE SET kind = $2, capacity = $3, has_positions = $4, location = $5, updated_by = $6, updated_at = now()`,
      [lotId, after.kind, after.capacity, after.hasPositions, after.location, actor.id],
    );
    await recordAudit(m, { actor, action: 'screening.setup', entityType: 'lot', entityId: lotId, before, after });
    return after;
  });
}

/** GET /api/lots/:id/screening: yield per bin (counts and %), outside count, the lot's containers. */
export async function lotScreening(ds: DataSource, lotId: number): Promise<LotScreening> {
  const [lot] = (await ds.query(
    `SELECT l.id, l.code, l.part_type_id, l.bin_scheme_id, l.status, p.part_number FROM lot l JOIN part_type p ON p.id = l.part_type_id WHERE l.id = $1`,
    [lotId],
  )) as (LotRowLite & { part_number: string; status: LotStatus })[];
  if (!lot) throw AppError.notFound(`Lot ${lotId}`);
  const schemeId = lot.bin_scheme_id ?? (await getCurrentScheme(ds.manager, lot.part_type_id))?.id ?? null;
  const scheme = schemeId === null ? null : await loadScheme(ds.manager, schemeId);
  const readings = (await ds.query(
    `SELECT me.hfe_25, me.vbe_mv_25,
            EXISTS (SELECT 1 FROM stock_movement sm WHERE sm.kind = 'screen-in' AND sm.measurement_id = me.id) AS placed
       FROM measurement me JOIN measurement_session s ON s.id = me.session_id
      WHERE me.lot_id = $1 AND NOT me.superseded
        AND (s.mode = 'screen' OR EXISTS (SELECT 1 FROM stock_movement sm WHERE sm.kind = 'screen-in' AND sm.measurement_id = me.id))`,
    [lotId],
  )) as { hfe_25: number; vbe_mv_25: number; placed: boolean }[];
  const screened = readings.length;
  const placed = readings.filter((r) => r.placed).length;
  const pct = (n: number) => (screened ? (100 * n) / screened : 0);
  let bins: LotScreening['bins'] = [];
  let outside = 0;
  if (scheme) {
    const counts = binCounts(scheme.bins, readings.map((r) => ({ hfe: r.hfe_25, vbeMv: r.vbe_mv_25 })));
    bins = scheme.bins.map((b, i) => ({
      code: b.code,
      label: b.label,
      hfeMin: b.hfeMin,
      hfeMax: b.hfeMax,
      index: i,
      isLast: i === scheme.bins.length - 1,
      count: counts.counts[i]?.count ?? 0,
      pct: pct(counts.counts[i]?.count ?? 0),
    }));
    outside = counts.outside;
  }
  const containers = (await ds.query(`${CONTAINER_SELECT} WHERE c.lot_id = $1 ORDER BY b.position NULLS LAST, c.id`, [lotId])) as ContainerSqlRow[];
  return {
    lotId: lot.id,
    lotCode: lot.code,
    partTypeId: lot.part_type_id,
    partNumber: lot.part_number,
    scheme: scheme ? { id: scheme.id, version: scheme.version, lockedAt: scheme.lockedAt ? new Date(scheme.lockedAt).toISOString() : null } : null,
    screened,
    placed,
    unplaced: screened - placed,
    bins,
    outside: { count: outside, pct: pct(outside) },
    setup: await loadSetup(ds.manager, lotId),
    containers: containers.map(toContainerRow),
    benchWork: await benchWorkOf(ds.manager, { id: lot.id, status: lot.status }),
  };
}

/** GET /api/lots/:id/screening/recent: the latest placements, newest first. */
export async function recentPlacements(ds: DataSource, lotId: number, limit: number): Promise<RecentPlacementsResponse> {
  const [lot] = (await ds.query(
    `SELECT l.id, EXISTS (SELECT 1 FROM measurement_session s WHERE s.lot_id = l.id AND s.mode = 'screen' AND s.closed_at IS NULL) AS open
       FROM lot l WHERE l.id = $1`,
    [lotId],
  )) as { id: number; open: boolean }[];
  if (!lot) throw AppError.notFound(`Lot ${lotId}`);
  const rows = (await ds.query(
    `SELECT sm.measurement_id, sm.quantity_delta, sm.quantity_after, sm.at, me.position AS lot_position, c.id AS container_id, c.code, c.capacity,
            c.bin_code, c.bin_scheme_id, s.version AS scheme_version, b.label AS bin_label, b.hfe_min, b.hfe_max,
            (SELECT count(*)::int FROM gain_bin g WHERE g.scheme_id = c.bin_scheme_id AND g.position < b.position) AS bin_index,
            (b.position = (SELECT max(g.position) FROM gain_bin g WHERE g.scheme_id = c.bin_scheme_id)) AS bin_is_last,
            sm.positions
       FROM stock_movement sm
       JOIN container c ON c.id = sm.container_id
       JOIN gain_bin_scheme s ON s.id = c.bin_scheme_id
       JOIN measurement me ON me.id = sm.measurement_id
       LEFT JOIN gain_bin b ON b.id = c.gain_bin_id
      WHERE c.lot_id = $1 AND sm.kind = 'screen-in'
      ORDER BY sm.id DESC LIMIT $2`,
    [lotId, limit],
  )) as (Pick<ContainerSqlRow, 'bin_code' | 'bin_label' | 'hfe_min' | 'hfe_max' | 'bin_index' | 'bin_is_last' | 'bin_scheme_id' | 'scheme_version'> & {
    measurement_id: string;
    quantity_delta: number;
    quantity_after: number;
    at: Date;
    lot_position: number;
    container_id: number;
    code: string;
    capacity: number;
    positions: number[] | null;
  })[];
  return {
    lotId,
    screeningOpen: lot.open,
    items: rows.map((r) => ({
      measurementId: String(r.measurement_id),
      lotPosition: r.lot_position,
      bin: toContainerBin(r),
      containerId: r.container_id,
      containerCode: r.code,
      position: r.positions?.[0] ?? null,
      openedContainer: r.quantity_delta === 1 && r.quantity_after === 1,
      filledContainer: r.quantity_after >= r.capacity,
      alreadyPlaced: r.quantity_delta === 0,
      at: new Date(r.at).toISOString(),
      containerQuantity: r.quantity_after,
      containerCapacity: r.capacity,
    })),
  };
}
