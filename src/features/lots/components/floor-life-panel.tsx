import { useState } from 'react';
import type { LotDetail } from '../../../../shared/api/lots.ts';
import { Button } from '../../../components/ui/button.tsx';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { Panel } from '../../../components/ui/page.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useOpenDryBag } from '../api/open-dry-bag.ts';
import { FloorLifeTag } from './floor-life-tag.tsx';
import { formatDateTime, formatHours, toLocalInput } from './format.ts';

const TONE = { ok: 'pass', warning: 'hold', expired: 'fail', unknown: 'hold', sealed: 'info', 'not-applicable': 'info' } as const;
const TITLE = {
  ok: 'Floor life running',
  warning: 'Floor life nearly used up',
  expired: 'Floor life exceeded — bake needed',
  unknown: 'Exposure unknown',
  sealed: 'Dry bag sealed',
  'not-applicable': 'No floor-life clock',
} as const;

/** The J-STD-033 floor-life clock of the lot, with the button that starts it. */
export function FloorLifePanel({ lot, canEdit }: { lot: LotDetail; canEdit: boolean }) {
  const f = lot.floorLife;
  const [open, setOpen] = useState(false);
  const [openedAt, setOpenedAt] = useState('');
  const mutation = useOpenDryBag();
  const err = mutation.error instanceof ApiError ? mutation.error : null;
  const clocked = f.state !== 'not-applicable';

  return (
    <Panel title="Floor life (J-STD-033)">
      <div className="flex flex-col gap-3" data-testid="floor-life">
        <div className="flex items-center gap-2 text-sm">
          <FloorLifeTag floorLife={f} />
          {f.expiresAt && <span className="text-ink-soft">runs out {formatDateTime(f.expiresAt)}</span>}
        </div>
        <Notice tone={TONE[f.state]} title={TITLE[f.state]}>
          {f.message}
          {f.floorLifeHours !== null && f.hoursLeft !== null && f.state !== 'expired' && ` (${formatHours(f.hoursLeft)} of ${f.floorLifeHours} h left)`}
        </Notice>
        {clocked && (
          <p className="text-xs text-ink-soft">
            Floor life assumes ≤ 30 °C / 60 % RH; a hotter or wetter floor shortens it. Once it runs out, bake the parts per J-STD-033 and your local procedure before
            soldering.
          </p>
        )}
        {canEdit && clocked && lot.dryBag !== 'opened' && (
          <div>
            <Button
              variant="primary"
              onClick={() => {
                setOpenedAt(toLocalInput(new Date()));
                mutation.reset();
                setOpen(true);
              }}
            >
              Bag opened — start the clock
            </Button>
          </div>
        )}
        {err && !open && <Notice tone="fail">{err.problem.detail}</Notice>}
      </div>
      <ConfirmDialog
        open={open}
        title="Start the floor-life clock?"
        confirmLabel="Start the clock"
        tone="primary"
        busy={mutation.isPending}
        onCancel={() => setOpen(false)}
        onConfirm={() =>
          mutation.mutate({ id: lot.id, openedAt: openedAt ? new Date(openedAt).toISOString() : undefined }, { onSuccess: () => setOpen(false) })
        }
      >
        <p>The clock cannot be stopped or restarted here once started. Record when the dry bag was opened:</p>
        <label className="mt-3 flex flex-col gap-1 text-sm font-semibold text-ink-soft">
          Bag opened at
          <input
            type="datetime-local"
            value={openedAt}
            onChange={(e) => setOpenedAt(e.target.value)}
            className="rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink"
          />
        </label>
        {err && <p className="mt-2 text-xs font-semibold text-fail">✕ {err.fieldError('openedAt') ?? err.problem.detail}</p>}
      </ConfirmDialog>
    </Panel>
  );
}
