import { KIT_STATUS_LABELS, type KitStatus, type MatchMode, type SetSize } from '../../../../shared/api/pairing.ts';

export const KIT_STATUS_TONE: Record<KitStatus, 'pass' | 'hold' | 'info' | 'fail' | 'neutral'> = {
  planned: 'neutral',
  reserved: 'info',
  picking: 'hold',
  pulled: 'pass',
  expired: 'fail',
  cancelled: 'neutral',
};

export const kitStatusLabel = (s: KitStatus) => KIT_STATUS_LABELS[s];

export function formatDateTime(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

export function formatTime(iso: string): string {
  return new Date(iso).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' });
}

export const fixed = (v: number, digits: number) => (Number.isFinite(v) ? v.toFixed(digits) : '—');

/** "3 pairs", "1 quad" */
export function setsText(n: number, size: SetSize): string {
  return `${n} ${size === 2 ? (n === 1 ? 'pair' : 'pairs') : n === 1 ? 'quad' : 'quads'}`;
}

export function modeText(mode: MatchMode): string {
  return mode === 'complementary' ? 'complementary NPN + PNP' : 'same polarity';
}

export const filterControl = 'rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink';
export const filterLabel = 'flex flex-col gap-1 text-sm font-semibold text-ink-soft';
