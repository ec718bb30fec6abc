import { useState, type FormEvent } from 'react';
import type { ContainerRow } from '../../../../shared/api/bins.ts';
import { Button } from '../../../components/ui/button.tsx';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useChangeContainer, type ContainerChange } from '../api/change-container.ts';
import { Modal } from './modal.tsx';

export type ContainerAction = 'move' | 'adjust' | 'scrap' | 'close';

const TITLES: Record<ContainerAction, string> = {
  move: 'Move container',
  adjust: 'Adjust the count',
  scrap: 'Scrap parts',
  close: 'Close container',
};

/** Parses "1, 3-5" into [1, 3, 4, 5]; null when the text is not such a list. */
export function parsePositions(text: string): number[] | null {
  const out: number[] = [];
  for (const part of text.split(/[,\s]+/).filter(Boolean)) {
    const m = /^(\d+)(?:-(\d+))?$/.exec(part);
    if (!m) return null;
    const a = Number(m[1]);
    const b = m[2] === undefined ? a : Number(m[2]);
    if (a < 1 || b < a || b - a > 10000) return null;
    for (let p = a; p <= b; p++) out.push(p);
  }
  return out.length ? [...new Set(out)] : null;
}

/**
 * Move, adjust, scrap or close one container. The form keeps what was typed when the server
 * refuses it and shows the field's error next to it; scrapping asks for confirmation first.
 */
export function ContainerActionDialog({
  container,
  action,
  onClose,
  onDone,
}: {
  container: ContainerRow;
  action: ContainerAction;
  onClose: () => void;
  onDone?: (message: string) => void;
}) {
  const change = useChangeContainer();
  const [form, setForm] = useState({ toLocation: '', delta: '', quantity: '', positions: '', reason: '' });
  const [localError, setLocalError] = useState<{ field: string; message: string } | null>(null);
  const [confirming, setConfirming] = useState<ContainerChange | null>(null);
  const err = change.error instanceof ApiError ? change.error : null;
  const fieldError = (f: string) => (localError?.field === f ? localError.message : err?.fieldError(f));
  const set = (k: keyof typeof form) => (e: { target: { value: string } }) => setForm((s) => ({ ...s, [k]: e.target.value }));

  const run = (c: ContainerChange, message: string) => {
    change.mutate(c, {
      onSuccess: () => {
        onDone?.(message);
        onClose();
      },
      onSettled: () => setConfirming(null),
    });
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setLocalError(null);
    change.reset();
    const id = container.id;
    const expectedVersion = container.version;
    if (action === 'move') return run({ action, id, body: { toLocation: form.toLocation, expectedVersion } }, `${container.code} moved to ${form.toLocation.trim()}.`);
    if (action === 'close') return run({ action, id, body: form.reason.trim() ? { reason: form.reason } : {} }, `${container.code} closed.`);
    if (action === 'adjust') {
      const delta = Number(form.delta);
      if (form.delta.trim() === '' || !Number.isInteger(delta) || delta === 0) return setLocalError({ field: 'delta', message: 'Give a whole number of parts, e.g. −2 or 3 (not 0).' });
      return run({ action, id, body: { delta, reason: form.reason, expectedVersion } }, `${container.code}: count ${delta > 0 ? '+' : ''}${delta}.`);
    }
    // Scrap: validated here, confirmed in a dialog, then sent.
    if (container.hasPositions) {
      const positions = parsePositions(form.positions);
      if (!positions) return setLocalError({ field: 'positions', message: 'List positions like 3, 7 or 10-12.' });
      setConfirming({ action: 'scrap', id, body: { positions, reason: form.reason, expectedVersion } });
    } else {
      const quantity = Number(form.quantity);
      if (!Number.isInteger(quantity) || quantity < 1) return setLocalError({ field: 'quantity', message: 'Give a whole number of parts, 1 or more.' });
      setConfirming({ action: 'scrap', id, body: { quantity, reason: form.reason, expectedVersion } });
    }
  };

  const scrapCount = confirming?.action === 'scrap' ? (confirming.body.positions?.length ?? confirming.body.quantity ?? 0) : 0;

  return (
    <Modal title={`${TITLES[action]} ${container.code}`} open onClose={onClose}>
      <form onSubmit={submit} noValidate className="grid gap-3" aria-label={TITLES[action]}>
        <p className="text-sm text-ink-soft">
          {container.quantity} of {container.capacity} {container.hasPositions ? 'places taken' : 'parts'} · at {container.location}
        </p>
        {err && <Notice tone="fail">{err.problem.detail}</Notice>}
        {action === 'move' && (
          <TextField label="New location" name="toLocation" value={form.toLocation} onChange={set('toLocation')} error={fieldError('toLocation')} autoFocus required maxLength={60} />
        )}
        {action === 'adjust' && (
          <TextField
            label="Change in count"
            name="delta"
            inputMode="numeric"
            hint="Negative for missing parts, positive for parts found."
            value={form.delta}
            onChange={set('delta')}
            error={fieldError('delta')}
            autoFocus
            required
          />
        )}
        {action === 'scrap' &&
          (container.hasPositions ? (
            <TextField label="Positions to scrap" name="positions" hint="e.g. 3, 7 or 10-12" value={form.positions} onChange={set('positions')} error={fieldError('positions')} autoFocus required />
          ) : (
            <TextField label="Parts to scrap" name="quantity" inputMode="numeric" value={form.quantity} onChange={set('quantity')} error={fieldError('quantity')} autoFocus required />
          ))}
        {action !== 'move' && (
          <TextField
            label={action === 'close' ? 'Note (optional)' : 'Reason'}
            name="reason"
            value={form.reason}
            onChange={set('reason')}
            error={fieldError('reason')}
            required={action !== 'close'}
            maxLength={300}
          />
        )}
        <div className="mt-1 flex justify-end gap-2">
          <Button type="button" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" variant={action === 'scrap' ? 'danger' : 'primary'} busy={change.isPending && !confirming}>
            {action === 'scrap' ? 'Scrap…' : TITLES[action].split(' ')[0]}
          </Button>
        </div>
      </form>
      <ConfirmDialog
        open={confirming !== null}
        title={`Scrap ${scrapCount} part${scrapCount === 1 ? '' : 's'} from ${container.code}?`}
        confirmLabel="Scrap"
        busy={change.isPending}
        onCancel={() => setConfirming(null)}
        onConfirm={() => confirming && run(confirming, `${scrapCount} part${scrapCount === 1 ? '' : 's'} scrapped from ${container.code}.`)}
      >
        The parts leave stock for good; the reason “{form.reason.trim()}” goes into the stock history and the audit trail.
      </ConfirmDialog>
    </Modal>
  );
}
