import { AppError } from './app-error.ts';

/** Socket errors of a connection attempt or of a connection that broke. */
const NETWORK_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'EPIPE', 'EAI_AGAIN']);
/**
 * SQLSTATEs that mean "the server is not there for you now" (PostgreSQL manual, appendix A):
 * 57P01 admin_shutdown, 57P02 crash_shutdown, 57P03 cannot_connect_now, 53300 too_many_connections;
 * class 08 is "connection exception".
 */
const SQLSTATES = new Set(['57P01', '57P02', '57P03', '53300']);
/** Messages of node-postgres (pg, pg-pool) for a lost or impossible connection. */
const MESSAGES = /Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error|Connection terminated unexpectedly|Client was closed and is not queryable/i;

interface ErrorLike {
  code?: unknown;
  syscall?: unknown;
  message?: unknown;
  driverError?: unknown;
}

/** True when an error says the database cannot be reached (down, restarting, unreachable). */
export function isDatabaseUnavailable(err: unknown): boolean {
  if (err instanceof AppError) return err.code === 'database-unavailable';
  if (!err || typeof err !== 'object') return false;
  const e = err as ErrorLike;
  if (e.driverError && e.driverError !== err && isDatabaseUnavailable(e.driverError)) return true;
  const code = typeof e.code === 'string' ? e.code : '';
  if (NETWORK_CODES.has(code) || SQLSTATES.has(code) || /^08[0-9A-Z]{3}$/.test(code)) return true;
  // A Unix-socket path that is gone: PostgreSQL removes its socket file when it stops.
  if (code === 'ENOENT' && e.syscall === 'connect') return true;
  return typeof e.message === 'string' && MESSAGES.test(e.message);
}

export function databaseUnavailable(): AppError {
  return new AppError(503, 'database-unavailable', 'The database cannot be reached right now, so nothing could be read or saved. Try again in a moment; if it keeps happening, tell your administrator.');
}
