import { useState } from 'react';
import { Link } from 'react-router-dom';
import { CONTAINER_KIND_LABELS, type ContainerDetail as Detail, type MovementKind, type PositionState } from '../../../../shared/api/bins.ts';
import { binColour } from '../../../../shared/domain/binning/index.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { Panel } from '../../../components/ui/page.tsx';
import { BigBin } from './bin-chip.tsx';
import { ContainerActionDialog, type ContainerAction } from './container-action-dialog.tsx';
import { ContainerStatusTag } from './container-status-tag.tsx';
import { formatDateTime } from './format.ts';
import { PrintLabelsPanel } from './print-labels-panel.tsx';

const STATE: Record<PositionState, { tone: 'pass' | 'hold' | 'info' | 'neutral' | 'fail'; word: string }> = {
  'in-stock': { tone: 'pass', word: 'in stock' },
  reserved: { tone: 'hold', word: 'reserved' },
  pulled: { tone: 'neutral', word: 'pulled' },
  scrapped: { tone: 'fail', word: 'scrapped' },
  rebinned: { tone: 'neutral', word: 're-binned' },
};

const MOVEMENT: Record<MovementKind, string> = {
  'screen-in': 'Screened in',
  move: 'Moved',
  adjust: 'Count adjusted',
  scrap: 'Scrapped',
  pull: 'Pulled',
  close: 'Closed',
};

/** The places of a positioned container as a grid: position, hFE and Vbe at 25 °C, state in words. */
function PositionsGrid({ detail }: { detail: Detail }) {
  const current = new Map<number, Detail['positions'][number]>();
  for (const p of detail.positions) if (!current.has(p.position)) current.set(p.position, p);
  const colour = binColour(detail.bin.code === null ? null : detail.bin.index);
  return (
    <ol className="grid grid-cols-[repeat(auto-fill,minmax(7.5rem,1fr))] gap-1.5" aria-label={`Positions of ${detail.code}`}>
      {Array.from({ length: detail.capacity }, (_, i) => i + 1).map((n) => {
        const p = current.get(n);
        const occupied = p && (p.state === 'in-stock' || p.state === 'reserved');
        return (
          <li
            key={n}
            className={`rounded border px-2 py-1 text-xs ${occupied ? 'border-rule bg-panel' : 'border-dashed border-rule bg-paper text-ink-faint'}`}
            style={occupied ? { borderLeft: `4px solid ${colour.fill}` } : undefined}
            aria-label={p ? `Position ${n}: hFE ${p.hfe25.toFixed(1)}, Vbe ${p.vbeMv25.toFixed(1)} mV, ${STATE[p.state].word}` : `Position ${n}: empty`}
          >
            <div className="flex items-center justify-between gap-1">
              <span className="num font-bold text-ink">#{n}</span>
              {p && <StatusTag tone={STATE[p.state].tone}>{STATE[p.state].word}</StatusTag>}
            </div>
            {p ? (
              <div className="num mt-0.5 leading-tight text-ink">
                hFE <strong>{p.hfe25.toFixed(1)}</strong>
                <br />
                Vbe {p.vbeMv25.toFixed(1)} mV
                <br />
                <span className="text-ink-faint">lot part {p.lotPosition}</span>
              </div>
            ) : (
              <div className="mt-0.5">empty</div>
            )}
          </li>
        );
      })}
    </ol>
  );
}

/** One container: its bin in large type, where it is, its parts and its history. */
export function ContainerDetailView({ detail, canEdit, lotHref }: { detail: Detail; canEdit: boolean; lotHref: ((id: number) => string) | null }) {
  const [acting, setActing] = useState<ContainerAction | null>(null);
  const [done, setDone] = useState<string | null>(null);
  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-wrap items-start gap-5">
        <BigBin bin={detail.bin} />
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-soft">Part</dt>
          <dd className="font-semibold">
            {detail.partNumber} <span className="font-normal text-ink-soft">at {detail.testCondition}, 25 °C</span>
          </dd>
          <dt className="text-ink-soft">Lot</dt>
          <dd>
            {lotHref ? (
              <Link to={lotHref(detail.lotId)} className="font-mono underline">
                {detail.lotCode}
              </Link>
            ) : (
              <span className="font-mono">{detail.lotCode}</span>
            )}{' '}
            · supplier lot {detail.supplierLot ?? '—'} · {detail.supplierName}
          </dd>
          <dt className="text-ink-soft">Holds</dt>
          <dd className="num">
            <strong data-testid="container-quantity">{detail.quantity}</strong> of {detail.capacity} · {CONTAINER_KIND_LABELS[detail.kind]}
            {detail.hasPositions ? ' with numbered positions' : ' (count only)'}
          </dd>
          <dt className="text-ink-soft">Location</dt>
          <dd data-testid="container-location">{detail.location}</dd>
          <dt className="text-ink-soft">Status</dt>
          <dd>
            <ContainerStatusTag status={detail.status} />
          </dd>
          <dt className="text-ink-soft">Opened</dt>
          <dd>
            {formatDateTime(detail.createdAt)} by {detail.createdByName} · scheme v{detail.bin.schemeVersion}
          </dd>
        </dl>
      </div>
      {canEdit && (
        <div className="flex flex-wrap gap-2">
          <Button onClick={() => setActing('move')}>Move…</Button>
          {!detail.hasPositions && <Button onClick={() => setActing('adjust')}>Adjust count…</Button>}
          <Button variant="danger" disabled={detail.quantity === 0} onClick={() => setActing('scrap')}>
            Scrap…
          </Button>
          {(detail.status === 'open' || detail.status === 'full') && <Button onClick={() => setActing('close')}>Close…</Button>}
        </div>
      )}
      {done && <Notice tone="pass">{done}</Notice>}
      {detail.hasPositions ? (
        <Panel title="Positions">
          <PositionsGrid detail={detail} />
        </Panel>
      ) : (
        <Notice tone="info" title="A container without positions">
          It holds a count; the parts' individual readings stay in the lot's measurements.
        </Notice>
      )}
      <div className="grid gap-5 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <Panel title="Stock history">
          <table className="w-full text-sm">
            <caption className="sr-only">Stock movements of {detail.code}, newest first</caption>
            <thead className="text-left text-xs uppercase tracking-wide text-ink-soft">
              <tr>
                <th className="py-1 pr-2">When</th>
                <th className="py-1 pr-2">What</th>
                <th className="py-1 pr-2">Δ</th>
                <th className="py-1 pr-2">After</th>
                <th className="py-1 pr-2">Details</th>
                <th className="py-1">Who</th>
              </tr>
            </thead>
            <tbody>
              {detail.movements.map((m) => (
                <tr key={m.id} className="border-t border-rule/70 align-top">
                  <td className="num py-1 pr-2 whitespace-nowrap">{formatDateTime(m.at)}</td>
                  <td className="py-1 pr-2">{MOVEMENT[m.kind]}</td>
                  <td className="num py-1 pr-2">{m.quantityDelta > 0 ? `+${m.quantityDelta}` : m.quantityDelta}</td>
                  <td className="num py-1 pr-2">{m.quantityAfter}</td>
                  <td className="py-1 pr-2">
                    {m.kind === 'move' && `${m.fromLocation} → ${m.toLocation}`}
                    {m.positions?.length ? `${m.kind === 'move' ? ' · ' : ''}pos. ${m.positions.join(', ')}` : ''}
                    {m.reason ? ` · ${m.reason}` : ''}
                  </td>
                  <td className="py-1">{m.userName}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </Panel>
        <Panel title="Bin label">
          {canEdit ? <PrintLabelsPanel containerIds={[detail.id]} /> : <p className="text-sm text-ink-soft">Inspectors and quality engineers print labels.</p>}
          <p className="mt-3 text-xs text-ink-faint">
            {detail.labelPrints === 0 ? 'Not printed yet.' : `Printed ${detail.labelPrints} time${detail.labelPrints === 1 ? '' : 's'}; last by ${detail.prints[0]?.printedByName} on ${formatDateTime(detail.prints[0]?.printedAt ?? detail.createdAt)}.`}
          </p>
        </Panel>
      </div>
      {acting && <ContainerActionDialog container={detail} action={acting} onClose={() => setActing(null)} onDone={setDone} />}
    </div>
  );
}
