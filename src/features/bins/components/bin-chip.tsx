import { OUTSIDE_BINS_CODE, type ContainerBin } from '../../../../shared/api/bins.ts';
import { binColour } from '../../../../shared/domain/binning/index.ts';
import { binIntervalText } from '../../../../shared/domain/screening/index.ts';

type ChipBin = Pick<ContainerBin, 'code' | 'label' | 'index'> & Partial<Pick<ContainerBin, 'hfeMin' | 'hfeMax' | 'isLast'>>;

/** The bin's interval in words, or a note for the parts outside all bins. */
export function binInterval(bin: ChipBin): string {
  if (bin.code === null || bin.hfeMin == null || bin.hfeMax == null) return 'outside every bin of the scheme';
  return binIntervalText({ hfeMin: bin.hfeMin, hfeMax: bin.hfeMax }, bin.isLast === true);
}

/** The bin's colour swatch carrying its code, then its label: colour is never the only signal. */
export function BinChip({ bin, showLabel = true, showInterval = false }: { bin: ChipBin; showLabel?: boolean; showInterval?: boolean }) {
  const c = binColour(bin.code === null ? null : bin.index);
  const code = bin.code ?? OUTSIDE_BINS_CODE;
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap">
      <span
        className="inline-flex min-w-[2rem] items-center justify-center rounded px-1.5 py-0.5 text-xs font-bold"
        style={{ background: c.fill, color: c.text }}
        title={`${bin.label} (${c.name})`}
      >
        {code}
      </span>
      {showLabel && <span className="text-sm text-ink">{bin.label}</span>}
      {showInterval && <span className="num text-xs text-ink-soft">{binInterval(bin)}</span>}
    </span>
  );
}

/** A large bin display for the bench: the code in big type on its colour, the label beside it. */
export function BigBin({ bin }: { bin: ChipBin }) {
  const c = binColour(bin.code === null ? null : bin.index);
  return (
    <span className="inline-flex items-stretch overflow-hidden rounded-lg border border-rule">
      <span className="flex min-w-[6rem] flex-col items-center justify-center px-4 py-2" style={{ background: c.fill, color: c.text }}>
        <span className="text-xs font-bold uppercase tracking-wider">{bin.code === null ? 'Outside' : 'Bin'}</span>
        <span className="text-5xl leading-none font-bold" data-testid="big-bin-code">
          {bin.code ?? OUTSIDE_BINS_CODE}
        </span>
      </span>
      <span className="flex flex-col justify-center bg-panel px-3 py-2">
        <span className="text-lg font-bold text-ink">{bin.label}</span>
        <span className="num text-sm text-ink-soft">{binInterval(bin)}</span>
      </span>
    </span>
  );
}
