import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import {
  OUTSIDE_BINS_CODE,
  type AdjustContainerRequest,
  type CloseContainerRequest,
  type ContainerDetail,
  type ContainerFilters,
  type ContainerRow,
  type ContainerSort,
  type MoveContainerRequest,
  type MovementKind,
  type ScrapContainerRequest,
} from '../../../shared/api/bins.ts';
import type { Page } from '../../../shared/api/page.ts';
import { CONTAINER_CODE_FORMAT, parseOwnCode } from '../../../shared/domain/labels/index.ts';
import { adjustQuantity, statusAfter, type ContainerStatus } from '../../../shared/domain/screening/index.ts';
import { AppError } from '../../http/app-error.ts';
import { likePattern } from '../../http/route-params.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { containerCodeOrderSql } from './container-code.ts';
import { CONTAINER_SELECT, loadContainerRow, toContainerRow, type ContainerSqlRow } from './container-view.ts';

const SORT_SQL: Record<ContainerSort, string> = {
  code: containerCodeOrderSql('c.code'),
  createdAt: 'c.created_at',
  quantity: 'c.quantity',
  location: 'c.location',
  status: 'c.status',
  bin: 'c.bin_code',
};

/** A page of containers, filtered and sorted on the server. */
export async function listContainers(ds: DataSource, f: Required<Pick<ContainerFilters, 'page' | 'pageSize'>> & ContainerFilters): Promise<Page<ContainerRow>> {
  const params: unknown[] = [];
  const where: string[] = [];
  const add = (sql: string, v: unknown) => {
    params.push(v);
    where.push(sql.replace(/\?/g, `$${params.length}`));
  };
  if (f.partTypeId !== undefined) add('c.part_type_id = ?', f.partTypeId);
  if (f.lotId !== undefined) add('c.lot_id = ?', f.lotId);
  if (f.status !== undefined) add('c.status = ?', f.status);
  if (f.bin !== undefined) {
    if (f.bin === OUTSIDE_BINS_CODE) where.push('c.bin_code IS NULL');
    else add('c.bin_code = ?', f.bin);
  }
  if (f.location !== undefined) add(`c.location ILIKE ? ESCAPE '\\'`, likePattern(f.location));
  if (f.search !== undefined) add(`(c.code ILIKE ? ESCAPE '\\' OR l.code ILIKE ? ESCAPE '\\' OR p.part_number ILIKE ? ESCAPE '\\')`, likePattern(f.search));
  const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const [{ total }] = (await ds.query(
    `SELECT count(*)::int AS total FROM container c JOIN lot l ON l.id = c.lot_id JOIN part_type p ON p.id = c.part_type_id ${whereSql}`,
    params,
  )) as { total: number }[];
  const dir = f.dir === 'desc' ? 'DESC' : 'ASC';
  const order = `${SORT_SQL[f.sort ?? 'createdAt']} ${dir} NULLS LAST, c.id ${dir}`;
  params.push(f.pageSize, (f.page - 1) * f.pageSize);
  const rows = (await ds.query(`${CONTAINER_SELECT} ${whereSql} ORDER BY ${order} LIMIT $${params.length - 1} OFFSET $${params.length}`, params)) as ContainerSqlRow[];
  return { items: rows.map(toContainerRow), total, page: f.page, pageSize: f.pageSize };
}

function testCondition(p: { polarity: string; hfe_ic_ma: number; hfe_vce_v: number }): string {
  const sign = p.polarity === 'PNP' ? '−' : '';
  return `IC = ${sign}${p.hfe_ic_ma} mA, VCE = ${sign}${p.hfe_vce_v} V`;
}

/** A container with its positions (each part's readings at 25 °C), movements and label prints. */
export async function containerDetail(m: EntityManager, id: number): Promise<ContainerDetail> {
  const row = await loadContainerRow(m, id);
  const [extra] = (await m.query(
    `SELECT s.name AS supplier_name, p.polarity, p.hfe_ic_ma, p.hfe_vce_v
       FROM lot l JOIN supplier s ON s.id = l.supplier_id JOIN part_type p ON p.id = l.part_type_id WHERE l.id = $1`,
    [row.lot_id],
  )) as { supplier_name: string; polarity: string; hfe_ic_ma: number; hfe_vce_v: number }[];
  const positions = (await m.query(
    `SELECT cp.position, cp.measurement_id, cp.state, cp.placed_at, me.position AS lot_position, me.hfe_25, me.vbe_mv_25
       FROM container_position cp JOIN measurement me ON me.id = cp.measurement_id
      WHERE cp.container_id = $1
      ORDER BY cp.position, (cp.state IN ('in-stock','reserved')) DESC, cp.id DESC`,
    [id],
  )) as { position: number; measurement_id: string; state: string; placed_at: Date; lot_position: number; hfe_25: number; vbe_mv_25: number }[];
  const movements = (await m.query(
    `SELECT sm.id, sm.kind, sm.quantity_delta, sm.quantity_after, sm.from_location, sm.to_location, sm.positions, sm.reason, sm.at,
            coalesce(u.name, 'system') AS user_name
       FROM stock_movement sm LEFT JOIN app_user u ON u.id = sm.user_id
      WHERE sm.container_id = $1 ORDER BY sm.id DESC LIMIT 500`,
    [id],
  )) as {
    id: string;
    kind: MovementKind;
    quantity_delta: number;
    quantity_after: number;
    from_location: string | null;
    to_location: string | null;
    positions: number[] | null;
    reason: string | null;
    at: Date;
    user_name: string;
  }[];
  const prints = (await m.query(
    `SELECT lp.id, lp.stock, lp.reprint, lp.quantity, lp.printed_at, u.name AS printed_by_name
       FROM label_print lp JOIN app_user u ON u.id = lp.printed_by WHERE lp.container_id = $1 ORDER BY lp.id DESC LIMIT 100`,
    [id],
  )) as { id: string; stock: string; reprint: boolean; quantity: number; printed_at: Date; printed_by_name: string }[];
  return {
    ...toContainerRow(row),
    supplierName: extra.supplier_name,
    testCondition: testCondition(extra),
    positions: positions.map((p) => ({
      position: p.position,
      measurementId: String(p.measurement_id),
      lotPosition: p.lot_position,
      hfe25: p.hfe_25,
      vbeMv25: p.vbe_mv_25,
      state: p.state as ContainerDetail['positions'][number]['state'],
      placedAt: new Date(p.placed_at).toISOString(),
    })),
    movements: movements.map((mv) => ({
      id: String(mv.id),
      kind: mv.kind,
      quantityDelta: mv.quantity_delta,
      quantityAfter: mv.quantity_after,
      fromLocation: mv.from_location,
      toLocation: mv.to_location,
      positions: mv.positions,
      reason: mv.reason,
      userName: mv.user_name,
      at: new Date(mv.at).toISOString(),
    })),
    prints: prints.map((p) => ({
      id: String(p.id),
      stock: p.stock,
      reprint: p.reprint,
      quantity: p.quantity,
      printedByName: p.printed_by_name,
      printedAt: new Date(p.printed_at).toISOString(),
    })),
  };
}

/** The container a scanned code names (our container code, any case), or 404. */
export async function containerByCode(ds: DataSource, code: string): Promise<ContainerDetail> {
  const own = parseOwnCode(code);
  if (!own || own.kind !== 'container') {
    throw AppError.unprocessable(`"${code.slice(0, 40)}" is not a container code (${CONTAINER_CODE_FORMAT}).`, [{ field: 'code', message: 'not a container code' }]);
  }
  const rows = (await ds.query(`SELECT id FROM container WHERE code = $1`, [own.code])) as { id: number }[];
  if (!rows[0]) throw AppError.notFound(`Container ${own.code}`);
  return containerDetail(ds.manager, rows[0].id);
}

interface Locked {
  id: number;
  code: string;
  lot_id: number;
  capacity: number;
  has_positions: boolean;
  quantity: number;
  location: string;
  status: ContainerStatus;
  version: number;
}

/**
 * Takes the container's row lock for the rest of the transaction: concurrent changes to one
 * container run one after another, each seeing the count the previous one left.
 */
async function lockContainer(m: EntityManager, id: number, expectedVersion?: number): Promise<Locked> {
  const rows = (await m.query(
    `SELECT id, code, lot_id, capacity, has_positions, quantity, location, status, version FROM container WHERE id = $1 FOR UPDATE`,
    [id],
  )) as Locked[];
  const c = rows[0];
  if (!c) throw AppError.notFound(`Container ${id}`);
  if (expectedVersion !== undefined && expectedVersion !== c.version) {
    throw AppError.conflict(`Container ${c.code} changed since you loaded it (version ${expectedVersion}, now ${c.version}). Reload and try again.`, [
      { field: 'expectedVersion', message: `the container is at version ${c.version}` },
    ]);
  }
  return c;
}

interface MovementInput {
  kind: MovementKind;
  delta: number;
  after: number;
  from?: string | null;
  to?: string | null;
  positions?: number[] | null;
  reason?: string | null;
  measurementId?: string | null;
}

export async function insertMovement(m: EntityManager, containerId: number, actor: Pick<SessionUser, 'id'> | null, mv: MovementInput): Promise<void> {
  await m.query(
    `INSERT INTO stock_movement (container_id, kind, quantity_delta, quantity_after, from_location, to_location, positions, measurement_id, reason, user_id)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10)`,
    [containerId, mv.kind, mv.delta, mv.after, mv.from ?? null, mv.to ?? null, mv.positions ?? null, mv.measurementId ?? null, mv.reason ?? null, actor?.id ?? null],
  );
}

async function saveState(m: EntityManager, c: Locked, change: { quantity?: number; status?: ContainerStatus; location?: string }): Promise<void> {
  await m.query(
    `UPDATE container SET quantity = $2, status = $3, location = $4, version = version + 1, updated_at = now() WHERE id = $1`,
    [c.id, change.quantity ?? c.quantity, change.status ?? c.status, change.location ?? c.location],
  );
}

const view = (c: Pick<Locked, 'quantity' | 'status' | 'location'>) => ({ quantity: c.quantity, status: c.status, location: c.location });

/** Moves a container to another storage location; the count does not change. */
export async function moveContainer(ds: DataSource, actor: SessionUser, id: number, input: MoveContainerRequest): Promise<ContainerDetail> {
  const to = input.toLocation.trim();
  return ds.transaction(async (m) => {
    const c = await lockContainer(m, id, input.expectedVersion);
    if (c.location === to) {
      throw AppError.unprocessable(`Container ${c.code} is already at ${to}.`, [{ field: 'toLocation', message: 'the container is already there' }]);
    }
    await saveState(m, c, { location: to });
    await insertMovement(m, c.id, actor, { kind: 'move', delta: 0, after: c.quantity, from: c.location, to });
    await recordAudit(m, { actor, action: 'container.move', entityType: 'container', entityId: c.id, before: { location: c.location }, after: { location: to } });
    return containerDetail(m, c.id);
  });
}

/**
 * Corrects the count of a container without positions (found or missing parts), with a reason.
 * Refused (409) when the count would go below zero or above the capacity.
 */
export async function adjustContainer(ds: DataSource, actor: SessionUser, id: number, input: AdjustContainerRequest): Promise<ContainerDetail> {
  const reason = input.reason.trim();
  return ds.transaction(async (m) => {
    const c = await lockContainer(m, id, input.expectedVersion);
    if (c.has_positions) {
      throw AppError.unprocessable(`Container ${c.code} has numbered positions, so each part is tracked: scrap the positions of parts that are gone.`, [
        { field: 'delta', message: 'adjust applies to containers without positions' },
      ]);
    }
    const r = adjustQuantity(c, input.delta);
    if (!r.ok) {
      if (r.reason === 'zero' || r.reason === 'not-whole') throw AppError.badRequest(`Check delta: ${r.message}.`, [{ field: 'delta', message: r.message }]);
      throw AppError.conflict(`Container ${c.code}: ${r.message}.`, [{ field: 'delta', message: r.message }]);
    }
    const status = statusAfter(c.status, r.quantity, c.capacity);
    await saveState(m, c, { quantity: r.quantity, status });
    await insertMovement(m, c.id, actor, { kind: 'adjust', delta: input.delta, after: r.quantity, reason });
    await recordAudit(m, {
      actor,
      action: 'container.adjust',
      entityType: 'container',
      entityId: c.id,
      before: view(c),
      after: { ...view(c), quantity: r.quantity, status },
      note: reason,
    });
    return containerDetail(m, c.id);
  });
}

/**
 * Scraps parts: a quantity from a container without positions, or the listed positions of a
 * positioned one (each must hold a part in stock; a reserved part belongs to a kit).
 */
export async function scrapFromContainer(ds: DataSource, actor: SessionUser, id: number, input: ScrapContainerRequest): Promise<ContainerDetail> {
  const reason = input.reason.trim();
  return ds.transaction(async (m) => {
    const c = await lockContainer(m, id, input.expectedVersion);
    let removed: number;
    let positions: number[] | null = null;
    if (c.has_positions) {
      if (input.quantity !== undefined || !input.positions?.length) {
        throw AppError.badRequest(`Container ${c.code} has numbered positions: name the positions to scrap.`, [{ field: 'positions', message: 'positions are required for this container' }]);
      }
      positions = [...new Set(input.positions)].sort((a, b) => a - b);
      const rows = (await m.query(
        `SELECT position, state FROM container_position WHERE container_id = $1 AND position = ANY($2) AND state IN ('in-stock','reserved') FOR UPDATE`,
        [c.id, positions],
      )) as { position: number; state: string }[];
      const byPos = new Map(rows.map((r) => [r.position, r.state]));
      const empty = positions.filter((p) => !byPos.has(p));
      if (empty.length) {
        throw AppError.conflict(`Position${empty.length > 1 ? 's' : ''} ${empty.join(', ')} of ${c.code} hold${empty.length > 1 ? '' : 's'} no part.`, [
          { field: 'positions', message: `no part at ${empty.join(', ')}` },
        ]);
      }
      const reserved = positions.filter((p) => byPos.get(p) === 'reserved');
      if (reserved.length) {
        throw AppError.conflict(`Position${reserved.length > 1 ? 's' : ''} ${reserved.join(', ')} of ${c.code} ${reserved.length > 1 ? 'are' : 'is'} reserved for a kit.`, [
          { field: 'positions', message: `reserved: ${reserved.join(', ')}` },
        ]);
      }
      await m.query(
        `UPDATE container_position SET state = 'scrapped', state_changed_at = now() WHERE container_id = $1 AND position = ANY($2) AND state = 'in-stock'`,
        [c.id, positions],
      );
      removed = positions.length;
    } else {
      if (input.positions !== undefined || input.quantity === undefined) {
        throw AppError.badRequest(`Container ${c.code} holds a count: give the quantity to scrap.`, [{ field: 'quantity', message: 'quantity is required for this container' }]);
      }
      removed = input.quantity;
    }
    const r = adjustQuantity(c, -removed);
    if (!r.ok) throw AppError.conflict(`Container ${c.code}: ${r.message}.`, [{ field: c.has_positions ? 'positions' : 'quantity', message: r.message }]);
    const status = statusAfter(c.status, r.quantity, c.capacity);
    await saveState(m, c, { quantity: r.quantity, status });
    await insertMovement(m, c.id, actor, { kind: 'scrap', delta: -removed, after: r.quantity, positions, reason });
    await recordAudit(m, {
      actor,
      action: 'container.scrap',
      entityType: 'container',
      entityId: c.id,
      before: view(c),
      after: { ...view(c), quantity: r.quantity, status, scrapped: removed, positions },
      note: reason,
    });
    return containerDetail(m, c.id);
  });
}

/** Closes an open or full container: screening no longer adds parts to it and opens a new one. */
export async function closeContainer(ds: DataSource, actor: SessionUser, id: number, input: CloseContainerRequest): Promise<ContainerDetail> {
  const reason = input.reason?.trim() || null;
  return ds.transaction(async (m) => {
    const c = await lockContainer(m, id);
    if (c.status === 'closed' || c.status === 'empty') throw AppError.conflict(`Container ${c.code} is already ${c.status}.`);
    await saveState(m, c, { status: 'closed' });
    await insertMovement(m, c.id, actor, { kind: 'close', delta: 0, after: c.quantity, reason });
    await recordAudit(m, { actor, action: 'container.close', entityType: 'container', entityId: c.id, before: view(c), after: { ...view(c), status: 'closed' }, note: reason });
    return containerDetail(m, c.id);
  });
}
