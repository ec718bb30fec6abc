import type { MismatchMeaning } from '../../../../shared/api/pairing.ts';
import { fixed } from './format.ts';

/**
 * What a set's mismatch means in a circuit, in words: the current ratio of a mirror built from it,
 * the input offset of a differential pair, and the hFE ratio (reference.md §5).
 */
export function MismatchMeaningText({ meaning, compact = false }: { meaning: MismatchMeaning; compact?: boolean }) {
  const items = [
    { term: 'Current mirror', value: `IC1/IC2 = ${fixed(meaning.mirrorRatio, 4)} (${fixed(meaning.mirrorErrorPct, 2)} % error)` },
    { term: 'Differential pair', value: `input offset ${fixed(meaning.offsetMv, 2)} mV` },
    { term: 'hFE ratio', value: `${fixed(meaning.hfeRatio, 3)} (smaller / larger)` },
  ];
  if (compact) {
    return (
      <span className="text-xs text-ink-soft">
        {items.map((i) => `${i.term}: ${i.value}`).join(' · ')}
      </span>
    );
  }
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-xs">
      {items.map((i) => (
        <div key={i.term} className="contents">
          <dt className="font-semibold text-ink-soft">{i.term}</dt>
          <dd className="num text-ink">{i.value}</dd>
        </div>
      ))}
    </dl>
  );
}

/** The explanation under a table of sets: where the mirror and offset figures come from. */
export function MismatchFootnote({ vtMv }: { vtMv: number }) {
  return (
    <p className="text-xs text-ink-faint">
      Mirror ratio IC1/IC2 = exp(ΔVbe/VT) with VT = {fixed(vtMv, 3)} mV at 25 °C, for equal saturation currents; a differential pair's input offset equals ΔVbe at equal collector
      currents. For a quad the figures are those of its worst pair.
    </p>
  );
}
