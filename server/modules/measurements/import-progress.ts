import type { ImportProgress } from '../../../shared/api/measurements.ts';

const TTL_MS = 10 * 60 * 1000;
const entries = new Map<string, { progress: ImportProgress; at: number }>();

/** Server-side phase of a running import, kept in memory per user and client token for ten minutes. */
export function setProgress(key: string, progress: ImportProgress): void {
  const now = Date.now();
  entries.set(key, { progress, at: now });
  for (const [k, v] of entries) if (now - v.at > TTL_MS) entries.delete(k);
}

export function getProgress(key: string): ImportProgress | null {
  return entries.get(key)?.progress ?? null;
}

export function progressKey(userId: number, token: string): string {
  return `${userId}:${token}`;
}
