import { useEffect, useState } from 'react';
import { BIN_LABEL_STOCKS, DEFAULT_BIN_LABEL_STOCK, binLabelStock } from '../../../../shared/api/bins.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { usePrintBinLabels } from '../api/print-bin-labels.ts';
import { filterControl, filterLabel } from './format.ts';

/**
 * Label stock and start cell for a print job of bin labels; the PDF opens in a new tab and stays
 * linked here. On a sheet the cells are shown as a grid: pick the first free one of a used sheet.
 */
export function PrintLabelsPanel({ containerIds, onPrinted }: { containerIds: number[]; onPrinted?: () => void }) {
  const [stockId, setStockId] = useState(DEFAULT_BIN_LABEL_STOCK);
  const [start, setStart] = useState(1);
  const [pdf, setPdf] = useState<{ url: string; labels: number; reprints: number } | null>(null);
  const print = usePrintBinLabels();
  const stock = binLabelStock(stockId) ?? BIN_LABEL_STOCKS[0];
  const cells = stock ? stock.columns * stock.rows : 1;
  const err = print.error instanceof ApiError ? print.error : null;
  useEffect(() => () => {
    if (pdf) URL.revokeObjectURL(pdf.url);
  }, [pdf]);

  const run = () => {
    const tab = window.open('', '_blank');
    print.mutate(
      { containerIds, stock: stockId, startPosition: start },
      {
        onSuccess: (out) => {
          setPdf(out);
          if (tab) tab.location.href = out.url;
          onPrinted?.();
        },
        onError: () => tab?.close(),
      },
    );
  };

  return (
    <div className="flex flex-col gap-3" aria-label="Print bin labels" role="group">
      <div className="flex flex-wrap items-end gap-3">
        <label className={filterLabel}>
          Label stock
          <select
            className={filterControl}
            value={stockId}
            onChange={(e) => {
              setStockId(e.target.value);
              setStart(1);
            }}
          >
            {BIN_LABEL_STOCKS.map((s) => (
              <option key={s.id} value={s.id}>
                {s.label}
              </option>
            ))}
          </select>
        </label>
        {stock && stock.kind === 'sheet' && (
          <label className={filterLabel}>
            Start at label
            <input
              type="number"
              min={1}
              max={cells}
              value={start}
              onChange={(e) => setStart(Math.max(1, Math.min(cells, Number(e.target.value) || 1)))}
              className={`${filterControl} w-24`}
            />
          </label>
        )}
        <Button variant="primary" busy={print.isPending} disabled={containerIds.length === 0} onClick={run}>
          Print {containerIds.length} label{containerIds.length === 1 ? '' : 's'}
        </Button>
      </div>
      {stock && stock.kind === 'sheet' && (
        <div>
          <p className="mb-1 text-xs text-ink-faint">Cells of a used sheet to skip (row by row); click the first free one.</p>
          <div className="inline-grid gap-0.5 rounded border border-rule bg-paper p-1" style={{ gridTemplateColumns: `repeat(${stock.columns}, 2.25rem)` }}>
            {Array.from({ length: cells }, (_, i) => i + 1).map((n) => (
              <button
                key={n}
                type="button"
                aria-label={`Start at label ${n}`}
                aria-pressed={n === start}
                onClick={() => setStart(n)}
                className={`num h-5 rounded-sm text-[10px] font-semibold ${n < start ? 'bg-rule text-ink-faint line-through' : n === start ? 'bg-copper text-white' : 'bg-panel text-ink-soft'}`}
              >
                {n}
              </button>
            ))}
          </div>
        </div>
      )}
      {err && <Notice tone="fail" title="The labels could not be printed">{err.problem.detail}</Notice>}
      {pdf && (
        <Notice tone="pass" title={`${pdf.labels} label${pdf.labels === 1 ? '' : 's'} ready${pdf.reprints ? ` (${pdf.reprints} reprint${pdf.reprints === 1 ? '' : 's'})` : ''}`}>
          <a href={pdf.url} target="_blank" rel="noopener" className="font-semibold underline">
            Open the label PDF
          </a>{' '}
          — print at 100 % (no “fit to page”) so the barcodes keep their size.
        </Notice>
      )}
    </div>
  );
}
