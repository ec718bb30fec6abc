import { useState, type FormEvent } from 'react';
import type { SessionMode, SessionRow } from '../../../../shared/api/measurements.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useCloseSession } from '../api/close-session.ts';
import { useStartSession } from '../api/start-session.ts';

const LAST_INSTRUMENT = 'binwright.bench.instrument';

/**
 * Starts a measurement session (instrument, ambient temperature, mode) or shows the open one.
 * `screenOnly`: the lot's signed disposition is MRB "100 % screen", so only a screening session
 * can start (the server refuses a sample session too).
 */
export function SessionPanel({ lotId, session, onChanged, screenOnly = false }: { lotId: number; session: SessionRow | null; onChanged: () => void; screenOnly?: boolean }) {
  const [form, setForm] = useState({ instrument: localStorage.getItem(LAST_INSTRUMENT) ?? '', ambientC: '23', mode: (screenOnly ? 'screen' : 'sample') as SessionMode });
  const mode: SessionMode = screenOnly ? 'screen' : form.mode;
  const start = useStartSession(lotId);
  const close = useCloseSession(lotId);
  const err = start.error instanceof ApiError ? start.error : null;

  if (session) {
    return (
      <div className="flex flex-wrap items-center justify-between gap-3 rounded-md border border-info bg-info-light px-3 py-2 text-sm" data-testid="open-session">
        <p className="text-ink">
          <span className="font-semibold">Session #{session.id}</span> · {session.instrument} · <span className="num">{session.ambientC} °C</span> ·{' '}
          {session.mode === 'sample' ? 'sample' : '100 % screening'} · started {new Date(session.startedAt).toLocaleTimeString()} by {session.operatorName}
        </p>
        <Button variant="quiet" busy={close.isPending} onClick={() => close.mutate(session.id, { onSuccess: onChanged })}>
          Close session
        </Button>
      </div>
    );
  }

  const submit = (e: FormEvent) => {
    e.preventDefault();
    localStorage.setItem(LAST_INSTRUMENT, form.instrument);
    start.mutate({ instrument: form.instrument, ambientC: Number(form.ambientC), mode }, { onSuccess: onChanged });
  };
  return (
    <form onSubmit={submit} noValidate aria-label="Start a measurement session" className="grid gap-3 sm:grid-cols-[2fr_1fr_1fr_auto] sm:items-end">
      {err && !err.problem.errors?.length && (
        <div className="sm:col-span-4">
          <Notice tone="fail">{err.problem.detail}</Notice>
        </div>
      )}
      <TextField label="Instrument" value={form.instrument} onChange={(e) => setForm({ ...form, instrument: e.target.value })} error={err?.fieldError('instrument')} placeholder="e.g. Curve tracer 2" />
      <TextField
        label="Ambient °C"
        inputMode="decimal"
        value={form.ambientC}
        onChange={(e) => setForm({ ...form, ambientC: e.target.value })}
        error={err?.fieldError('ambientC')}
      />
      <SelectField
        label="Mode"
        value={mode}
        onChange={(e) => setForm({ ...form, mode: e.target.value as SessionMode })}
        error={err?.fieldError('mode')}
        hint={screenOnly ? 'Sampling is closed' : undefined}
        options={[
          ...(screenOnly ? [] : [{ value: 'sample', label: 'Sample' }]),
          { value: 'screen', label: '100 % screening' },
        ]}
      />
      <Button type="submit" variant="primary" busy={start.isPending}>
        Start session
      </Button>
    </form>
  );
}
