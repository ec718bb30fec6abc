import { LOT_SORTS, LOT_STATUSES, type LotSort, type LotStatus } from '../../../shared/api/lots.ts';
import type { FieldError } from '../../../shared/api/problem.ts';
import { AppError } from '../../http/app-error.ts';
import { parsePaging } from '../../http/paging.ts';
import type { LotQuery } from './lots.service.ts';

const KNOWN = new Set(['page', 'pageSize', 'status', 'supplierId', 'partTypeId', 'receivedFrom', 'receivedTo', 'search', 'sort', 'dir']);
const DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

function day(value: unknown, field: string, errors: FieldError[]): Date | undefined {
  if (value === undefined || value === '') return undefined;
  const m = typeof value === 'string' ? DAY.exec(value) : null;
  const d = m ? new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]))) : null;
  if (!m || !d || d.toISOString().slice(0, 10) !== value) {
    errors.push({ field, message: `${field} must be a date YYYY-MM-DD` });
    return undefined;
  }
  return d;
}

function id(value: unknown, field: string, errors: FieldError[]): number | undefined {
  if (value === undefined || value === '') return undefined;
  const n = Number(value);
  if (!Number.isInteger(n) || n < 1) {
    errors.push({ field, message: `${field} must be a positive whole number` });
    return undefined;
  }
  return n;
}

/** Reads the lots list query: paging, filters and sort; every bad or unknown parameter is named. */
export function parseLotQuery(query: Record<string, unknown>): LotQuery {
  const { page, pageSize } = parsePaging(query);
  const errors: FieldError[] = [];
  for (const key of Object.keys(query)) if (!KNOWN.has(key)) errors.push({ field: key, message: `${key} is not a known filter` });
  for (const [key, v] of Object.entries(query)) if (KNOWN.has(key) && Array.isArray(v)) errors.push({ field: key, message: `give ${key} once` });
  if (errors.length) throw AppError.badRequest(`Check ${errors.map((e) => e.field).join(', ')}.`, errors);

  const status = query.status === undefined || query.status === '' ? undefined : String(query.status);
  if (status !== undefined && !(LOT_STATUSES as readonly string[]).includes(status)) {
    errors.push({ field: 'status', message: `status must be one of ${LOT_STATUSES.join(', ')}` });
  }
  const sort = query.sort === undefined || query.sort === '' ? 'receivedAt' : String(query.sort);
  if (!(LOT_SORTS as readonly string[]).includes(sort)) errors.push({ field: 'sort', message: `sort must be one of ${LOT_SORTS.join(', ')}` });
  const dirText = query.dir === undefined || query.dir === '' ? (sort === 'receivedAt' ? 'desc' : 'asc') : String(query.dir);
  if (dirText !== 'asc' && dirText !== 'desc') errors.push({ field: 'dir', message: 'dir must be asc or desc' });
  const receivedFrom = day(query.receivedFrom, 'receivedFrom', errors);
  const to = day(query.receivedTo, 'receivedTo', errors);
  if (receivedFrom && to && to < receivedFrom) errors.push({ field: 'receivedTo', message: 'receivedTo is before receivedFrom' });
  const search = typeof query.search === 'string' && query.search.trim() ? query.search.trim().slice(0, 100) : undefined;
  const supplierId = id(query.supplierId, 'supplierId', errors);
  const partTypeId = id(query.partTypeId, 'partTypeId', errors);
  if (errors.length) throw AppError.badRequest(`Check ${errors.map((e) => e.field).join(', ')}.`, errors);

  return {
    page,
    pageSize,
    status: status as LotStatus | undefined,
    supplierId,
    partTypeId,
    receivedFrom,
    receivedBefore: to ? new Date(to.getTime() + 86_400_000) : undefined,
    search,
    sort: sort as LotSort,
    dir: dirText as 'asc' | 'desc',
  };
}
