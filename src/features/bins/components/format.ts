import { CONTAINER_STATUS_LABELS, type ContainerStatus } from '../../../../shared/api/bins.ts';

export function formatDateTime(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

export function formatDate(iso: string): string {
  return new Date(iso).toLocaleDateString(undefined, { dateStyle: 'medium' });
}

export const STATUS_TONE: Record<ContainerStatus, 'pass' | 'hold' | 'info' | 'neutral'> = {
  open: 'info',
  full: 'pass',
  closed: 'neutral',
  empty: 'hold',
};

export function statusLabel(s: ContainerStatus): string {
  return CONTAINER_STATUS_LABELS[s];
}

export const filterControl = 'rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink';
export const filterLabel = 'flex flex-col gap-1 text-sm font-semibold text-ink-soft';
