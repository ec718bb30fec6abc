/**
 * Bin labels figure for `npm run bench`: 500 bin labels in one PDF (Data Matrix and Code 128 as
 * vector modules, Source Sans 3 embedded), rendered in memory. No database: the figure is the
 * rendering itself, which is what a print job of 500 containers waits for. Target under 3 s.
 */
import { pathToFileURL } from 'node:url';
import { BIN_LABEL_STOCKS } from '../shared/api/bins.ts';
import { formatLabel, makeContainerCode } from '../shared/domain/labels/index.ts';
import { binIntervalText, binLabelElements } from '../shared/domain/screening/index.ts';
import { renderBinLabels, type BinLabelContent } from '../server/modules/bins/bin-label-pdf.ts';

/** Invented demo-like content for `n` containers over four bins. */
export function sampleBinLabels(n: number): BinLabelContent[] {
  const bins = [
    { code: 'A', label: 'Gain group A', hfeMin: 110, hfeMax: 180 },
    { code: 'B', label: 'Gain group B', hfeMin: 180, hfeMax: 260 },
    { code: 'C', label: 'Gain group C', hfeMin: 260, hfeMax: 360 },
    { code: 'D', label: 'Gain group D', hfeMin: 360, hfeMax: 450 },
  ];
  return Array.from({ length: n }, (_, i) => {
    const bi = i % bins.length;
    const b = bins[bi] as (typeof bins)[number];
    // Numbers from a busy day (99 751 on), so the job holds 5- and 6-digit codes, the widest.
    const code = makeContainerCode(new Date(Date.UTC(2026, 11, 1, 12)), 99_751 + i);
    const quantity = 50 - (i % 7);
    return {
      containerCode: code,
      binCode: b.code,
      binLabel: b.label,
      binIndex: bi,
      interval: `${binIntervalText(b, bi === bins.length - 1)} (scheme v2)`,
      testCondition: 'at IC = 2 mA, VCE = 5 V, 25 °C',
      partNumber: 'HP-NPN-SS-01',
      lotCode: 'L-20261201-0007',
      supplierLot: 'RV-88231',
      quantity,
      date: '2026-12-01',
      inspector: 'Ines Ortega',
      payload: formatLabel(binLabelElements({ partNumber: 'HP-NPN-SS-01', containerCode: code, supplierLot: 'RV-88231', quantity })),
    };
  });
}

/** Renders 500 bin labels into one PDF on the 100 × 50 mm roll; returns the time and size. */
export async function benchBinLabels(count = 500, stockId = '100x50'): Promise<{ ms: number; bytes: number; labels: number }> {
  const stock = BIN_LABEL_STOCKS.find((s) => s.id === stockId);
  if (!stock) throw new Error(`unknown stock ${stockId}`);
  const labels = sampleBinLabels(count);
  await renderBinLabels(labels.slice(0, 50), stock, 1, new Date(Date.UTC(2026, 11, 1))); // warm-up: fonts, bwip-js, JIT
  const t0 = performance.now();
  const pdf = await renderBinLabels(labels, stock, 1, new Date(Date.UTC(2026, 11, 1)));
  return { ms: performance.now() - t0, bytes: pdf.length, labels: count };
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const out = await benchBinLabels();
  console.log(`[bench] ${out.labels} bin labels in one PDF: ${out.ms.toFixed(0)} ms, ${(out.bytes / 1024).toFixed(0)} KiB (target < 3000 ms)`);
}
