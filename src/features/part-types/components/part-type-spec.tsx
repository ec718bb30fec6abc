import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { APPROVAL_LABELS, type PartTypeDetail } from '../../../../shared/api/catalog.ts';
import { SAMPLING_METHOD_LABELS } from '../../../../shared/domain/sampling/index.ts';
import { StatusTag } from '../../../components/ui/notice.tsx';
import { esdDescription, mslDescription } from '../lib/part-type-options.ts';

function Item({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="flex flex-col border-b border-rule/70 py-1.5 sm:flex-row sm:gap-3">
      <dt className="w-48 shrink-0 text-sm text-ink-soft">{term}</dt>
      <dd className="text-sm text-ink">{children}</dd>
    </div>
  );
}

/** A signed value with a true minus sign, e.g. −2 or +0.5. */
const signed = (n: number) => (n < 0 ? `−${Math.abs(n)}` : n > 0 ? `+${n}` : '0');

const range = (min: number | null, max: number | null, unit = '') => {
  if (min === null && max === null) return 'no limits';
  if (min === null) return `≤ ${max}${unit}`;
  if (max === null) return `≥ ${min}${unit}`;
  return `${min} to ${max}${unit}`;
};

/** The part type's specification as a definition list. */
export function PartTypeSpec({ part, supplierPath }: { part: PartTypeDetail; supplierPath: (id: number) => string }) {
  return (
    <dl>
      <Item term="Polarity, package">
        {part.polarity}, {part.packageName}
      </Item>
      <Item term="hFE limits">
        <span className="num">{range(part.hfeMin, part.hfeMax)}</span> at IC <span className="num">{part.hfeIcMa} mA</span>, VCE{' '}
        <span className="num">{part.hfeVceV} V</span>
      </Item>
      <Item term="Vbe limits">
        <span className="num">{range(part.vbeMinMv, part.vbeMaxMv, ' mV')}</span> at IC <span className="num">{part.vbeIcMa} mA</span>
      </Item>
      <Item term="Temperature coefficients">
        <span className="num">
          Vbe {signed(part.vbeTcMvPerC)} mV/°C · hFE {signed(part.hfeTcPctPerC)} %/°C
        </span>{' '}
        <span className="text-ink-faint">(readings normalised to 25 °C)</span>
      </Item>
      <Item term="Moisture sensitivity">{mslDescription(part.msl)}</Item>
      <Item term="ESD">{esdDescription(part.esdHbmClass)}</Item>
      <Item term="Sampling default">
        {SAMPLING_METHOD_LABELS[part.samplingMethod]}, level {part.inspectionLevel}, AQL <span className="num">{part.aql} %</span>
      </Item>
      <Item term="Matching tolerance">
        <span className="num">
          hFE within {part.matchHfePct} %, Vbe within {part.matchVbeMv} mV
        </span>
      </Item>
      <Item term="Supplied as">
        {part.suppliers.length === 0 ? (
          <span className="text-ink-faint">No supplier part number is mapped to this part yet.</span>
        ) : (
          <ul className="flex flex-col gap-1">
            {part.suppliers.map((s) => (
              <li key={s.mappingId} className="flex flex-wrap items-center gap-2">
                <span className="num font-semibold">{s.supplierPartNumber}</span>
                <span className="text-ink-soft">from</span>
                <Link to={supplierPath(s.supplierId)} className="text-copper-dark underline-offset-2 hover:underline">
                  {s.supplierName}
                </Link>
                <StatusTag tone={s.approval === 'approved' ? 'pass' : s.approval === 'conditional' ? 'hold' : 'fail'}>{APPROVAL_LABELS[s.approval]}</StatusTag>
              </li>
            ))}
          </ul>
        )}
      </Item>
    </dl>
  );
}
