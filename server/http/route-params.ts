import { AppError } from './app-error.ts';

/** Reads a positive whole-number id from a route parameter, or answers 400 naming it. */
export function parseIdParam(value: unknown, field = 'id'): number {
  const id = typeof value === 'string' && /^\d{1,9}$/.test(value) ? Number(value) : NaN;
  if (!Number.isInteger(id) || id < 1) {
    throw AppError.badRequest(`The ${field} must be a positive whole number.`, [{ field, message: `${field} must be a positive whole number` }]);
  }
  return id;
}

/** Reads an optional one-line text filter from a query string; blank means absent. */
export function queryText(value: unknown, field: string, maxLength = 100): string | undefined {
  if (value === undefined) return undefined;
  if (typeof value !== 'string' || value.length > maxLength) {
    throw AppError.badRequest(`Check ${field}.`, [{ field, message: `${field} must be text of at most ${maxLength} characters` }]);
  }
  return value.trim() || undefined;
}

/** Reads an optional value that must be one of a list, or answers 400 naming the field. */
export function queryChoice<T extends string>(value: unknown, field: string, choices: readonly T[]): T | undefined {
  if (value === undefined || value === '') return undefined;
  if (typeof value !== 'string' || !(choices as readonly string[]).includes(value)) {
    throw AppError.badRequest(`Check ${field}.`, [{ field, message: `${field} must be one of ${choices.join(', ')}` }]);
  }
  return value as T;
}

/** Escapes % and _ for use inside an ILIKE pattern. */
export function likePattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, '\\$&')}%`;
}

/** True for a PostgreSQL unique violation (SQLSTATE 23505), optionally of one constraint or index. */
export function isUniqueViolation(err: unknown, constraint?: string): boolean {
  const e = err as { code?: string; constraint?: string; driverError?: { code?: string; constraint?: string } };
  const code = e?.code ?? e?.driverError?.code;
  const name = e?.constraint ?? e?.driverError?.constraint;
  return code === '23505' && (constraint === undefined || name === constraint);
}
