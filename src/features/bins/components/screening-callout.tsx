import { Link } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice.tsx';
import { useRecentPlacements } from '../api/get-lot-screening.ts';
import { BigBin } from './bin-chip.tsx';

/**
 * For the bench during 100 % screening: where the part just measured goes — its bin in large
 * type (code on its colour, label and interval beside it), the container and the position — so
 * the operator drops it in the right place without reading a table.
 */
export function ScreeningCallout({ lotId, containerHref }: { lotId: number; containerHref: (id: number) => string }) {
  const q = useRecentPlacements(lotId);
  const last = q.data?.items[0];
  if (!q.data || (!q.data.screeningOpen && !last)) return null;
  if (!last) {
    return (
      <div className="mb-4">
        <Notice tone="info" title="Screening into bins">
          Each part's bin, container and position appear here in large type as soon as its reading is recorded.
        </Notice>
      </div>
    );
  }
  return (
    <section aria-live="polite" aria-label="Where the last part goes" className="mb-4 rounded-lg border-2 border-ink/20 bg-panel p-3" data-testid="screening-callout">
      <p className="mb-2 text-xs font-bold uppercase tracking-wide text-ink-soft">Part {last.lotPosition} goes to</p>
      <div className="flex flex-wrap items-center gap-4">
        <BigBin bin={last.bin} />
        <div className="text-ink">
          <p className="text-2xl font-bold">
            <Link to={containerHref(last.containerId)} className="font-mono underline-offset-4 hover:underline">
              {last.containerCode}
            </Link>
          </p>
          <p className="num text-xl">{last.position === null ? `count ${last.containerQuantity} of ${last.containerCapacity}` : `position ${last.position} of ${last.containerCapacity}`}</p>
        </div>
      </div>
      {last.openedContainer && <p className="mt-2 text-sm font-semibold text-info">New container opened: label it before it leaves the bench.</p>}
      {last.filledContainer && <p className="mt-2 text-sm font-semibold text-hold">! This container is now full: close it, print its label and put it away.</p>}
      {q.data.items.length > 1 && (
        <p className="mt-2 text-xs text-ink-soft">
          Before:{' '}
          {q.data.items
            .slice(1)
            .map((p) => `part ${p.lotPosition} → ${p.bin.code ?? 'OUT'} ${p.containerCode}${p.position === null ? '' : ` #${p.position}`}`)
            .join(' · ')}
        </p>
      )}
    </section>
  );
}
