import { AppError } from './app-error.ts';

/** Reads `page` (1-based) and `pageSize` (1–200, default 25) from a query string. */
export function parsePaging(query: Record<string, unknown>, defaultSize = 25): { page: number; pageSize: number } {
  const page = query.page === undefined ? 1 : Number(query.page);
  const pageSize = query.pageSize === undefined ? defaultSize : Number(query.pageSize);
  const errors = [];
  if (!Number.isInteger(page) || page < 1) errors.push({ field: 'page', message: 'page must be a whole number ≥ 1' });
  if (!Number.isInteger(pageSize) || pageSize < 1 || pageSize > 200) {
    errors.push({ field: 'pageSize', message: 'pageSize must be a whole number from 1 to 200' });
  }
  if (errors.length) throw AppError.badRequest(`Check ${errors.map((e) => e.field).join(', ')}.`, errors);
  return { page, pageSize };
}
