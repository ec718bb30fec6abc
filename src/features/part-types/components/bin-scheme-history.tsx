import type { BinSchemeVersionRow } from '../../../../shared/api/catalog.ts';
import { Button } from '../../../components/ui/button.tsx';
import { StatusTag } from '../../../components/ui/notice.tsx';

const range = (b: { hfeMin: number; hfeMax: number }) => `${b.hfeMin}–${b.hfeMax}`;

export function LockBadge({ version }: { version: BinSchemeVersionRow }) {
  if (!version.locked) return <StatusTag tone="info">Not used yet</StatusTag>;
  if (version.lotCount === 0) return <StatusTag tone="hold">Locked</StatusTag>;
  return <StatusTag tone="hold">{`Locked · used by ${version.lotCount} lot${version.lotCount === 1 ? '' : 's'}`}</StatusTag>;
}

/** Every version of the scheme, newest first, with its bins, lock state and author. */
export function BinSchemeHistory({
  versions,
  editingId,
  onStartFrom,
}: {
  versions: BinSchemeVersionRow[];
  editingId?: number | null;
  /** When given (quality engineers), each version offers to load its bins into the editor. */
  onStartFrom?: (version: BinSchemeVersionRow) => void;
}) {
  return (
    <ol aria-label="Scheme versions" className="flex flex-col gap-2">
      {versions.map((v) => (
        <li key={v.id} className={`rounded-md border px-3 py-2 ${v.current ? 'border-copper bg-copper-light/30' : 'border-rule bg-panel'}`}>
          <div className="flex flex-wrap items-center gap-2">
            <span className="font-bold text-ink">Version {v.version}</span>
            {v.current && <StatusTag tone="pass">Current</StatusTag>}
            <LockBadge version={v} />
            <span className="text-xs text-ink-faint">
              {new Date(v.createdAt).toLocaleDateString()}
              {v.createdByName ? ` · ${v.createdByName}` : ''}
            </span>
            {onStartFrom && (
              <Button variant="quiet" className="ml-auto" onClick={() => onStartFrom(v)} disabled={editingId === v.id}>
                {editingId === v.id ? 'In the editor' : 'Start from this version'}
              </Button>
            )}
          </div>
          {v.note && <p className="mt-0.5 text-sm text-ink-soft">{v.note}</p>}
          <ul className="mt-1 flex flex-wrap gap-1.5" aria-label={`Bins of version ${v.version}`}>
            {v.bins.map((b) => (
              <li key={b.id} className="num rounded border border-rule bg-paper px-1.5 py-0.5 text-xs text-ink" title={b.label}>
                {b.gapBeforeIntended && <span className="text-ink-faint">⋯ </span>}
                <span className="font-bold">{b.code}</span> {range(b)}
                {(b.vbeMinMv !== null || b.vbeMaxMv !== null) && (
                  <span className="text-ink-soft">
                    {' '}
                    · Vbe {b.vbeMinMv ?? '…'}–{b.vbeMaxMv ?? '…'} mV
                  </span>
                )}
              </li>
            ))}
          </ul>
        </li>
      ))}
    </ol>
  );
}
