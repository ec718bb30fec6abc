import { useState } from 'react';
import { Loading } from '../../../components/ui/page.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { useSessions } from '../api/get-sessions.ts';
import { EntryGrid, type PartForEntry } from './entry-grid.tsx';
import { ImportPanel } from './import-panel.tsx';
import { SessionPanel } from './session-panel.tsx';

/**
 * Measurement capture on a lot: the user's open session (or the form to start one), then the
 * keyboard entry grid or the tester CSV import.
 */
export function MeasurementCapture({
  lotId,
  userId,
  part,
  quantity,
  closed,
  screenOnly = false,
  onChanged,
}: {
  lotId: number;
  userId: number;
  part: PartForEntry;
  quantity: number;
  /** The disposition is signed: no more readings (unless `screenOnly`). */
  closed: boolean;
  /** The signed disposition is MRB "100 % screen": screening sessions only. */
  screenOnly?: boolean;
  onChanged: () => void;
}) {
  const [tab, setTab] = useState<'grid' | 'import'>('grid');
  const sessions = useSessions(lotId);
  if (closed && !screenOnly) return <Notice tone="info" title="Measurements are closed">The disposition of this lot is signed; its readings can be read and exported but not changed.</Notice>;
  if (sessions.isLoading) return <Loading label="Loading sessions…" />;
  if (sessions.isError) return <Notice tone="fail" title="Sessions could not be loaded">{(sessions.error as Error).message}</Notice>;
  const data = sessions.data;
  const open = data?.sessions.find((s) => s.closedAt === null && s.operatorId === userId) ?? null;
  const changed = () => {
    void sessions.refetch();
    onChanged();
  };
  return (
    <div className="flex flex-col gap-4">
      {screenOnly && (
        <Notice tone="info" title="100 % screening after the signed disposition">
          The signed MRB disposition of this lot is "100 % screen": screen every part into its gain bin in a 100 % screening session. The sample the disposition rests on is closed.
        </Notice>
      )}
      <SessionPanel lotId={lotId} session={open} onChanged={changed} screenOnly={screenOnly} />
      {open && (
        <>
          <div role="tablist" aria-label="How to enter readings" className="flex gap-1 border-b border-rule">
            {(
              [
                ['grid', 'Keyboard entry'],
                ['import', 'Tester CSV import'],
              ] as const
            ).map(([key, label]) => (
              <button
                key={key}
                role="tab"
                type="button"
                aria-selected={tab === key}
                onClick={() => setTab(key)}
                className={`-mb-px border-b-2 px-3 py-1.5 text-sm font-semibold ${tab === key ? 'border-copper text-ink' : 'border-transparent text-ink-soft hover:text-ink'}`}
              >
                {label}
              </button>
            ))}
          </div>
          {tab === 'grid' ? (
            <EntryGrid key={open.id} lotId={lotId} session={open} part={part} nextPosition={data?.nextPosition ?? 1} quantity={quantity} onRecorded={onChanged} />
          ) : (
            <ImportPanel lotId={lotId} session={open} onImported={changed} />
          )}
        </>
      )}
    </div>
  );
}
