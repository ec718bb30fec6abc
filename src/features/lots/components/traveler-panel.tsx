import { useState } from 'react';
import { DEFAULT_TRAVELER_STOCK, TRAVELER_STOCKS, type TravelerStockId } from '../../../../shared/api/lots.ts';
import { Panel } from '../../../components/ui/page.tsx';

/** Picks a label stock and opens the traveler PDF in a new tab, ready to print. */
export function TravelerPanel({ lotId, code }: { lotId: number; code: string }) {
  const [stock, setStock] = useState<TravelerStockId>(DEFAULT_TRAVELER_STOCK);
  const href = `/api/lots/${lotId}/traveler.pdf?stock=${stock}`;
  return (
    <Panel title="Traveler label">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
          Label stock
          <select value={stock} onChange={(e) => setStock(e.target.value as TravelerStockId)} className="rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink">
            {TRAVELER_STOCKS.map((s) => (
              <option key={s.id} value={s.id}>
                {s.label}
              </option>
            ))}
          </select>
        </label>
        <a
          href={href}
          target="_blank"
          rel="noopener"
          className="inline-flex items-center gap-2 rounded-md border border-copper-dark bg-copper px-3 py-1.5 text-sm font-semibold text-white hover:bg-copper-dark"
        >
          Open traveler PDF
        </a>
      </div>
      <p className="mt-2 text-xs text-ink-faint">
        Code 128 and Data Matrix of {code}, part, supplier, quantity, date code, MSL and ESD marks. Print at 100 % (no “fit to page”) so the barcodes keep their size.
      </p>
    </Panel>
  );
}
