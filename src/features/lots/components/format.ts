import type { FloorLifeView } from '../../../../shared/api/lots.ts';

export function formatDateTime(iso: string | null): string {
  return iso ? new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' }) : '—';
}

export function formatDate(iso: string): string {
  return new Date(iso).toLocaleDateString(undefined, { dateStyle: 'medium' });
}

export function formatHours(h: number): string {
  if (h >= 48) {
    const total = Math.round(h);
    return `${Math.floor(total / 24)} d ${total % 24} h`;
  }
  return `${h.toFixed(1)} h`;
}

/** Value for a datetime-local input from a Date, in the browser's time zone. */
export function toLocalInput(d: Date): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

/** Short text for a floor-life state, always said in words as well as colour. */
export function floorLifeSummary(f: FloorLifeView): { tone: 'pass' | 'hold' | 'fail' | 'neutral'; text: string } {
  switch (f.state) {
    case 'ok':
      return { tone: 'pass', text: `${formatHours(f.hoursLeft ?? 0)} left` };
    case 'warning':
      return { tone: 'hold', text: `Only ${formatHours(f.hoursLeft ?? 0)} left` };
    case 'expired':
      return { tone: 'fail', text: 'Bake needed' };
    case 'sealed':
      return { tone: 'neutral', text: `Sealed · MSL ${f.msl}` };
    case 'unknown':
      return { tone: 'hold', text: `No dry bag · MSL ${f.msl}` };
    default:
      return { tone: 'neutral', text: f.msl ? `MSL ${f.msl} · no clock` : 'No clock' };
  }
}
