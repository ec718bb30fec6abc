import type { DataSource, EntityManager } from 'typeorm';
import type { Polarity } from '../../../shared/api/catalog.ts';
import type { KitPartLine, KitPartTypeInfo, KitPlan, KitPlanRequest, KitSetView, MatchMode, SetSize } from '../../../shared/api/pairing.ts';
import { orderPickList } from '../../../shared/domain/kitting/index.ts';
import { MatchingInputError, matchSets, type MatchPart } from '../../../shared/domain/matching/index.ts';
import { AppError } from '../../http/app-error.ts';
import { PART_TYPE_INFO_SELECT, setPartOrder, toPartTypeInfo, type PartPlaceSqlRow, type PartTypeInfoSqlRow } from './kit-view.ts';
import { meaningOfSet } from './set-meaning.ts';
import { releaseExpiredKits } from './kit-expiry.ts';

/** A kit request with its part types loaded and the tolerances settled. */
export interface ResolvedKitRequest {
  partTypes: KitPartTypeInfo[];
  mode: MatchMode;
  setSize: SetSize;
  setsWanted: number;
  hfeTolerancePct: number;
  vbeToleranceMv: number;
}

/**
 * Loads the part type(s) of a request and settles its tolerances: a same-polarity kit names one
 * part type; a complementary kit names an NPN and a PNP type. Missing tolerances come from the
 * part type (the tighter of the two for a complementary kit). 404/422 name the field at fault.
 */
export async function resolveKitRequest(m: EntityManager, req: KitPlanRequest): Promise<ResolvedKitRequest> {
  const ids = [req.partTypeId, ...(req.complementPartTypeId !== undefined ? [req.complementPartTypeId] : [])];
  const rows = (await m.query(`${PART_TYPE_INFO_SELECT} WHERE id = ANY($1)`, [ids])) as PartTypeInfoSqlRow[];
  const byId = new Map(rows.map((r) => [r.id, toPartTypeInfo(r)]));
  const first = byId.get(req.partTypeId);
  if (!first) throw AppError.unprocessable(`Part type ${req.partTypeId} does not exist.`, [{ field: 'partTypeId', message: 'no such part type' }]);
  const partTypes = [first];
  if (req.mode === 'same') {
    if (req.complementPartTypeId !== undefined) {
      throw AppError.unprocessable('A same-polarity kit takes one part type; a complement only goes with mode "complementary".', [
        { field: 'complementPartTypeId', message: 'only for mode complementary' },
      ]);
    }
  } else {
    if (req.complementPartTypeId === undefined) {
      throw AppError.unprocessable('A complementary kit needs the complementary part type (the opposite polarity).', [
        { field: 'complementPartTypeId', message: 'name the complementary part type' },
      ]);
    }
    const second = byId.get(req.complementPartTypeId);
    if (!second) throw AppError.unprocessable(`Part type ${req.complementPartTypeId} does not exist.`, [{ field: 'complementPartTypeId', message: 'no such part type' }]);
    if (second.polarity === first.polarity) {
      throw AppError.unprocessable(`${first.partNumber} and ${second.partNumber} are both ${first.polarity}: a complementary kit pairs an NPN with a PNP type.`, [
        { field: 'complementPartTypeId', message: 'must have the opposite polarity' },
      ]);
    }
    partTypes.push(second);
    // NPN first, as the sets show them.
    partTypes.sort((a, b) => (a.polarity === 'NPN' ? -1 : 1) - (b.polarity === 'NPN' ? -1 : 1));
  }
  const hfeTolerancePct = req.hfeTolerancePct ?? Math.min(...partTypes.map((p) => p.matchHfePct));
  const vbeToleranceMv = req.vbeToleranceMv ?? Math.min(...partTypes.map((p) => p.matchVbeMv));
  return { partTypes, mode: req.mode, setSize: req.setSize, setsWanted: req.setsWanted, hfeTolerancePct, vbeToleranceMv };
}

/** One measured part in stock: where it is and where it came from. */
export interface StockPart {
  positionId: string;
  containerId: number;
  containerCode: string;
  position: number;
  location: string;
  binCode: string | null;
  measurementId: string;
  lotId: number;
  lotCode: string;
  supplierLot: string | null;
  supplierName: string;
  partTypeId: number;
  partNumber: string;
  polarity: Polarity;
  hfe25: number;
  vbeMv25: number;
}

interface StockSqlRow extends PartPlaceSqlRow {
  position_id: string;
}

/**
 * The parts in stock of the part types: in-stock positions of positioned containers, with their
 * current readings at 25 °C. Parts outside all gain bins are left out (they are outside the part's
 * bins). With `lock`, the position rows are locked (FOR UPDATE, in id order so two reservations
 * never wait on each other in a cycle) until the transaction ends; a reservation that waits sees
 * the rows again after the other commits and skips those no longer in stock.
 */
export async function loadStock(m: EntityManager, partTypeIds: number[], lock: boolean): Promise<StockPart[]> {
  const rows = (await m.query(
    `SELECT cp.id AS position_id, cp.container_id, c.code AS container_code, cp.position, c.location, c.bin_code,
            cp.measurement_id, c.lot_id, l.code AS lot_code, l.supplier_lot, s.name AS supplier_name,
            c.part_type_id, pt.part_number, pt.polarity, me.hfe_25, me.vbe_mv_25
       FROM container_position cp
       JOIN container c ON c.id = cp.container_id
       JOIN lot l ON l.id = c.lot_id
       JOIN supplier s ON s.id = l.supplier_id
       JOIN part_type pt ON pt.id = c.part_type_id
       JOIN measurement me ON me.id = cp.measurement_id
      WHERE cp.state = 'in-stock' AND c.part_type_id = ANY($1) AND c.has_positions AND c.bin_code IS NOT NULL AND NOT me.superseded
      ORDER BY cp.id
      ${lock ? 'FOR UPDATE OF cp' : ''}`,
    [partTypeIds],
  )) as StockSqlRow[];
  return rows.map((r) => ({
    positionId: String(r.position_id),
    containerId: r.container_id,
    containerCode: r.container_code,
    position: r.position,
    location: r.location,
    binCode: r.bin_code,
    measurementId: String(r.measurement_id),
    lotId: r.lot_id,
    lotCode: r.lot_code,
    supplierLot: r.supplier_lot,
    supplierName: r.supplier_name,
    partTypeId: r.part_type_id,
    partNumber: r.part_number,
    polarity: r.polarity,
    hfe25: r.hfe_25,
    vbeMv25: r.vbe_mv_25,
  }));
}

function toLine(p: StockPart, setIndex: number): KitPartLine {
  return {
    setIndex,
    containerId: p.containerId,
    containerCode: p.containerCode,
    position: p.position,
    location: p.location,
    measurementId: p.measurementId,
    lotId: p.lotId,
    lotCode: p.lotCode,
    supplierLot: p.supplierLot,
    supplierName: p.supplierName,
    partTypeId: p.partTypeId,
    partNumber: p.partNumber,
    polarity: p.polarity,
    hfe25: p.hfe25,
    vbeMv25: p.vbeMv25,
    binCode: p.binCode,
    pulledAt: null,
    pulledByName: null,
    releasedAt: null,
  };
}

export interface ComputedPlan extends KitPlan {
  /** Position ids of each planned set, in set order. */
  chosen: { set: KitSetView; positionIds: string[] }[];
}

/**
 * Matches the stock at the request's tolerances (shared/domain/matching matchSets: the most sets
 * first, then the smallest total mismatch) and keeps the `setsWanted` sets of smallest mismatch.
 * Pure given the stock; nothing is reserved.
 */
export function planKit(r: ResolvedKitRequest, stock: readonly StockPart[]): ComputedPlan {
  const byId = new Map(stock.map((p) => [p.positionId, p]));
  const parts: MatchPart[] = stock.map((p) => ({ id: p.positionId, polarity: p.polarity, hfe: p.hfe25, vbeMv: p.vbeMv25 }));
  let result: ReturnType<typeof matchSets>;
  try {
    result = matchSets(parts, { hfeTolerancePct: r.hfeTolerancePct, vbeToleranceMv: r.vbeToleranceMv, setSize: r.setSize, mode: r.mode });
  } catch (e) {
    if (e instanceof MatchingInputError && !e.field.startsWith('parts')) throw AppError.badRequest(`Check ${e.field}: ${e.message}.`, [{ field: e.field, message: e.message }]);
    throw e;
  }
  const ranked = [...result.sets].sort((a, b) => a.mismatch - b.mismatch || a.hfeSpreadPct - b.hfeSpreadPct || a.vbeSpreadMv - b.vbeSpreadMv);
  const planned = ranked.slice(0, r.setsWanted);
  const chosen = planned.map((s, i) => {
    const ps = s.partIds.map((id) => byId.get(String(id)) as StockPart);
    const set: KitSetView = {
      index: i + 1,
      hfeSpreadPct: s.hfeSpreadPct,
      vbeSpreadMv: s.vbeSpreadMv,
      mismatch: s.mismatch,
      meaning: meaningOfSet(s),
      parts: ps.map((p) => toLine(p, i + 1)).sort(setPartOrder),
    };
    return { set, positionIds: ps.map((p) => p.positionId) };
  });
  const pickList = orderPickList(chosen.flatMap((c) => c.set.parts));
  return {
    partTypes: r.partTypes,
    mode: r.mode,
    setSize: r.setSize,
    hfeTolerancePct: r.hfeTolerancePct,
    vbeToleranceMv: r.vbeToleranceMv,
    setsWanted: r.setsWanted,
    setsPossible: result.sets.length,
    setsPlanned: planned.length,
    stockParts: stock.length,
    method: result.method,
    optimal: result.optimal,
    upperBound: result.upperBound ?? null,
    sets: chosen.map((c) => c.set),
    pickList,
    containers: new Set(pickList.map((p) => p.containerId)).size,
    chosen,
  };
}

/** POST /api/kits/plan: what a request would reserve now (nothing changes; expired reservations are released first). */
export async function planKitRequest(ds: DataSource, req: KitPlanRequest): Promise<KitPlan> {
  await releaseExpiredKits(ds);
  const r = await resolveKitRequest(ds.manager, req);
  const stock = await loadStock(ds.manager, r.partTypes.map((p) => p.id), false);
  const { chosen: _chosen, ...plan } = planKit(r, stock);
  return plan;
}
