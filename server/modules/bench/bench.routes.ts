import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { BENCH_QUEUE_STATUSES, type BenchQueueRow, type BenchQueueSort, type LotStatus } from '../../../shared/api/bench.ts';
import type { Page } from '../../../shared/api/users.ts';
import { AppError } from '../../http/app-error.ts';
import { parsePaging } from '../../http/paging.ts';

const SORT_SQL: Record<BenchQueueSort, string> = {
  receivedAt: 'l.received_at',
  code: 'l.code',
  status: 'l.status',
  quantity: 'l.quantity',
};
const ALL_STATUSES: LotStatus[] = ['received', 'inspecting', 'awaiting-signature', 'accepted', 'rejected', 'mrb'];

interface QueueQuery {
  page: number;
  pageSize: number;
  statuses: LotStatus[];
  search?: string;
  sort: BenchQueueSort;
  dir: 'asc' | 'desc';
}

/** Lots waiting at the bench (or any statuses asked for), with how many parts are measured. */
export async function benchQueue(ds: DataSource, q: QueueQuery): Promise<Page<BenchQueueRow>> {
  const params: unknown[] = [q.statuses];
  let where = 'l.status = ANY($1)';
  if (q.search) {
    params.push(`%${q.search.replace(/[%_\\]/g, '\\$&')}%`);
    where += ` AND (l.code ILIKE $${params.length} OR p.part_number ILIKE $${params.length} OR s.name ILIKE $${params.length})`;
  }
  const from = 'FROM lot l JOIN part_type p ON p.id = l.part_type_id JOIN supplier s ON s.id = l.supplier_id';
  const [{ total }] = (await ds.query(`SELECT count(*)::int AS total ${from} WHERE ${where}`, params)) as { total: number }[];
  params.push(q.pageSize, (q.page - 1) * q.pageSize);
  const rows = (await ds.query(
    `SELECT l.id, l.code, l.status, l.quantity, p.part_number, s.name AS supplier_name, l.received_at,
            (SELECT count(*)::int FROM measurement m WHERE m.lot_id = l.id AND NOT m.superseded) AS measured
       ${from} WHERE ${where}
      ORDER BY ${SORT_SQL[q.sort]} ${q.dir === 'desc' ? 'DESC' : 'ASC'}, l.id ${q.dir === 'desc' ? 'DESC' : 'ASC'}
      LIMIT $${params.length - 1} OFFSET $${params.length}`,
    params,
  )) as { id: number; code: string; status: LotStatus; quantity: number; part_number: string; supplier_name: string; received_at: Date; measured: number }[];
  return {
    items: rows.map((r) => ({
      id: r.id,
      code: r.code,
      status: r.status,
      quantity: r.quantity,
      partNumber: r.part_number,
      supplierName: r.supplier_name,
      receivedAt: new Date(r.received_at).toISOString(),
      measured: r.measured,
    })),
    total,
    page: q.page,
    pageSize: q.pageSize,
  };
}

/** GET /api/bench/queue?status=received,inspecting&search=&sort=&dir=&page=&pageSize= */
export function benchRouter(ds: DataSource): Router {
  const r = Router();
  r.get('/bench/queue', async (req, res) => {
    const { page, pageSize } = parsePaging(req.query);
    const raw = typeof req.query.status === 'string' && req.query.status ? req.query.status.split(',') : [...BENCH_QUEUE_STATUSES];
    const bad = raw.filter((s) => !ALL_STATUSES.includes(s as LotStatus));
    if (bad.length) throw AppError.badRequest('Unknown lot status.', [{ field: 'status', message: `status must be among ${ALL_STATUSES.join(', ')}` }]);
    const sort = (req.query.sort ?? 'receivedAt') as BenchQueueSort;
    if (!(sort in SORT_SQL)) throw AppError.badRequest('Unknown sort.', [{ field: 'sort', message: `sort must be one of ${Object.keys(SORT_SQL).join(', ')}` }]);
    res.json(
      await benchQueue(ds, {
        page,
        pageSize,
        statuses: raw as LotStatus[],
        search: typeof req.query.search === 'string' && req.query.search.trim() ? req.query.search.trim() : undefined,
        sort,
        dir: req.query.dir === 'asc' ? 'asc' : 'desc',
      }),
    );
  });
  return r;
}
