import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { CONTAINER_KINDS, CONTAINER_KIND_LABELS, type ContainerKind, type LotScreening, type ScreeningSetup } from '../../../../shared/api/bins.ts';
import { binColour } from '../../../../shared/domain/binning/index.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { Loading, Panel } from '../../../components/ui/page.tsx';
import { ScrollBox } from '../../../components/ui/scroll-box.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useLotScreening } from '../api/get-lot-screening.ts';
import { usePlaceScreened, useSaveScreeningSetup } from '../api/place-screened.ts';
import { BinChip, binInterval } from './bin-chip.tsx';
import { ContainerStatusTag } from './container-status-tag.tsx';
import { PrintLabelsPanel } from './print-labels-panel.tsx';

function YieldTable({ s }: { s: LotScreening }) {
  const rows = [
    ...s.bins.map((b) => ({ key: b.code, chip: <BinChip bin={b} />, interval: binInterval(b), count: b.count, pct: b.pct, fill: binColour(b.index).fill })),
    {
      key: 'outside',
      chip: <BinChip bin={{ code: null, label: 'Outside all bins', index: null }} />,
      interval: 'no bin',
      count: s.outside.count,
      pct: s.outside.pct,
      fill: binColour(null).fill,
    },
  ];
  return (
    <ScrollBox label="Screening yield per bin">
      <table className="w-full text-sm">
        <caption className="sr-only">Screening yield per bin</caption>
        <thead className="text-left text-xs uppercase tracking-wide text-ink-soft">
          <tr>
            <th className="py-1 pr-2">Bin</th>
            <th className="py-1 pr-2 whitespace-nowrap">hFE at 25 °C</th>
            <th className="py-1 pr-2 text-right">Parts</th>
            <th className="py-1 pr-2 text-right">Yield</th>
            <th className="w-1/4 min-w-[3rem] py-1" aria-hidden />
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.key} className="border-t border-rule/70">
              <td className="py-1 pr-2 whitespace-nowrap">{r.chip}</td>
              <td className="num py-1 pr-2 whitespace-nowrap text-ink-soft">{r.interval}</td>
              <td className="num py-1 pr-2 text-right font-semibold">{r.count.toLocaleString()}</td>
              <td className="num py-1 pr-2 whitespace-nowrap text-right">{r.pct.toFixed(1)} %</td>
              <td className="py-1" aria-hidden>
                <div className="h-2.5 rounded-sm" style={{ width: `${Math.max(r.pct, r.count ? 1 : 0)}%`, background: r.fill }} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollBox>
  );
}

function SetupForm({ lotId, setup }: { lotId: number; setup: ScreeningSetup }) {
  const save = useSaveScreeningSetup();
  const [form, setForm] = useState({ kind: setup.kind, capacity: String(setup.capacity), hasPositions: setup.hasPositions, location: setup.location });
  const err = save.error instanceof ApiError ? save.error : null;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    save.mutate({ lotId, kind: form.kind, capacity: Number(form.capacity), hasPositions: form.hasPositions, location: form.location });
  };
  return (
    <form onSubmit={submit} noValidate className="grid gap-2 sm:grid-cols-2" aria-label="New containers">
      <SelectField
        label="Container kind"
        value={form.kind}
        onChange={(e) => setForm((f) => ({ ...f, kind: e.target.value as ContainerKind }))}
        error={err?.fieldError('kind')}
        options={CONTAINER_KINDS.map((k) => ({ value: k, label: CONTAINER_KIND_LABELS[k] }))}
      />
      <TextField label="Capacity" inputMode="numeric" value={form.capacity} onChange={(e) => setForm((f) => ({ ...f, capacity: e.target.value }))} error={err?.fieldError('capacity')} />
      <TextField label="Kept at" value={form.location} onChange={(e) => setForm((f) => ({ ...f, location: e.target.value }))} error={err?.fieldError('location')} />
      <label className="flex items-center gap-2 self-end pb-2 text-sm font-semibold text-ink-soft">
        <input type="checkbox" checked={form.hasPositions} onChange={(e) => setForm((f) => ({ ...f, hasPositions: e.target.checked }))} />
        Numbered positions (each part keeps its reading)
      </label>
      <div className="flex items-center gap-3 sm:col-span-2">
        <Button type="submit" busy={save.isPending}>
          Save for new containers
        </Button>
        {save.isSuccess && <span className="text-sm text-pass">✓ Saved</span>}
        {err && !err.problem.errors?.length && <span className="text-sm text-fail">{err.problem.detail}</span>}
      </div>
    </form>
  );
}

/**
 * A lot's 100 % screening: yield per bin (counts and %), the parts outside all bins, the
 * containers made from the lot (with their labels), and how new containers are made. After a
 * signed MRB "100 % screen" disposition it says that screening is what the lot now needs, with a
 * link to the lot at the bench (`benchHref`, when the role has the Bench).
 */
export function LotScreeningPanel({
  lotId,
  canEdit,
  containerHref,
  benchHref = null,
}: {
  lotId: number;
  canEdit: boolean;
  containerHref: (id: number) => string;
  benchHref?: string | null;
}) {
  const q = useLotScreening(lotId);
  const place = usePlaceScreened();
  const placeErr = place.error instanceof ApiError ? place.error : null;
  if (q.isLoading) return <Loading label="Loading the screening…" />;
  if (q.isError || !q.data)
    return (
      <Notice tone="fail" title="The screening could not be loaded">
        {(q.error as Error | null)?.message}
      </Notice>
    );
  const s = q.data;
  return (
    <Panel title="Screening into gain bins">
      <div className="flex flex-col gap-4" data-testid="lot-screening">
        <p className="text-sm text-ink-soft">
          {s.scheme ? `Scheme version ${s.scheme.version}${s.scheme.lockedAt ? ' (locked for this lot)' : ' (locked when screening starts)'}` : 'The part type has no gain-bin scheme yet.'} ·{' '}
          <span className="num">{s.screened.toLocaleString()}</span> parts screened, <span className="num">{s.placed.toLocaleString()}</span> in containers. Intervals are half-open [min, max),
          the last bin closed.
        </p>
        {s.benchWork === 'screen-only' && (
          <div data-testid="screen-after-signing">
            <Notice tone="info" title="Signed disposition: MRB — 100 % screen">
              Every part of this lot is to be screened into its gain bin: start a session in 100 % screening mode at the bench. Sample sessions are closed.
              {benchHref && (
                <>
                  {' '}
                  <Link to={benchHref} className="font-semibold text-ink underline">
                    Screen at the bench
                  </Link>
                </>
              )}
            </Notice>
          </div>
        )}
        {s.screened > 0 && <YieldTable s={s} />}
        {s.unplaced > 0 && (
          <Notice tone="hold" title={`${s.unplaced} screened part${s.unplaced === 1 ? ' has' : 's have'} no container yet`}>
            {canEdit ? (
              <Button variant="primary" busy={place.isPending} onClick={() => place.mutate({ lotId })}>
                Place them into bins
              </Button>
            ) : (
              'An inspector places them.'
            )}
          </Notice>
        )}
        {placeErr && <Notice tone="fail">{placeErr.problem.detail}</Notice>}
        {place.data && place.data.placed > 0 && (
          <Notice tone="pass">
            {place.data.placed} part{place.data.placed === 1 ? '' : 's'} placed{place.data.containersOpened ? `, ${place.data.containersOpened} new container${place.data.containersOpened === 1 ? '' : 's'}` : ''}.
          </Notice>
        )}
        {s.containers.length > 0 && (
          <div>
            <h3 className="mb-1 text-sm font-bold text-ink">Containers from this lot</h3>
            <ul className="divide-y divide-rule/70 text-sm">
              {s.containers.map((c) => (
                <li key={c.id} className="flex flex-wrap items-center gap-3 py-1">
                  <Link to={containerHref(c.id)} className="font-mono font-semibold underline">
                    {c.code}
                  </Link>
                  <BinChip bin={c.bin} />
                  <span className="num">
                    {c.quantity} / {c.capacity}
                  </span>
                  <ContainerStatusTag status={c.status} />
                  <span className="text-ink-soft">{c.location}</span>
                </li>
              ))}
            </ul>
            {canEdit && (
              <div className="mt-3 rounded border border-rule bg-paper p-3">
                <p className="mb-2 text-sm font-semibold">Bin labels for all {s.containers.length} containers</p>
                <PrintLabelsPanel containerIds={s.containers.map((c) => c.id)} />
              </div>
            )}
          </div>
        )}
        {canEdit && (
          <details className="rounded border border-rule p-3">
            <summary className="cursor-pointer text-sm font-semibold text-ink">
              New containers: {CONTAINER_KIND_LABELS[s.setup.kind].toLowerCase()} of {s.setup.capacity}
              {s.setup.hasPositions ? ' numbered places' : ' parts'}, kept at {s.setup.location}
            </summary>
            <div className="mt-3">
              <SetupForm key={JSON.stringify(s.setup)} lotId={lotId} setup={s.setup} />
            </div>
          </details>
        )}
      </div>
    </Panel>
  );
}
