import type { ParseLabelResponse } from '../../../../shared/api/labels.ts';
import { describeDataIdentifier } from '../../../../shared/domain/labels/index.ts';

const FIELD_ROWS: { key: keyof ParseLabelResponse['fields']; label: string; di: string }[] = [
  { key: 'customerPartNumber', label: 'Customer part number', di: 'P' },
  { key: 'supplierPartNumber', label: 'Supplier part number', di: '1P' },
  { key: 'quantity', label: 'Quantity', di: 'Q' },
  { key: 'purchaseOrder', label: 'Purchase order', di: 'K' },
  { key: 'supplierLot', label: 'Supplier lot', di: '1T' },
  { key: 'dateCode', label: 'Date code', di: '10D/9D/11D' },
  { key: 'countryOfOrigin', label: 'Country of origin', di: '4L' },
  { key: 'msl', label: 'MSL', di: '13E' },
];

/** What the label says: mapped fields, identifiers without a field (kept, not dropped), warnings. */
export function ParsedLabel({ parsed }: { parsed: ParseLabelResponse }) {
  return (
    <div className="grid gap-3 text-sm" data-testid="parsed-label">
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
        {FIELD_ROWS.map((r) => (
          <div key={r.key} className="contents">
            <dt className="text-ink-soft">
              {r.label} <span className="font-mono text-xs text-ink-faint">{r.di}</span>
            </dt>
            <dd className="font-mono">{parsed.fields[r.key] ?? <span className="text-ink-faint">—</span>}</dd>
          </div>
        ))}
      </dl>
      {parsed.unknown.length > 0 && (
        <div>
          <p className="font-semibold text-ink-soft">Other identifiers on the label (kept with the lot)</p>
          <ul className="mt-1 grid gap-0.5" aria-label="Unmapped data identifiers">
            {parsed.unknown.map((e, i) => (
              <li key={`${e.di}-${i}`} className="font-mono text-xs">
                <span className="rounded bg-paper px-1 font-bold">{e.di}</span> {e.value}
                <span className="ml-2 font-sans text-ink-faint">{describeDataIdentifier(e.di) ?? 'not described here'}</span>
              </li>
            ))}
          </ul>
        </div>
      )}
      {parsed.warnings.length > 0 && (
        <ul className="list-disc pl-5 text-xs text-hold" aria-label="Label warnings">
          {parsed.warnings.map((w) => (
            <li key={w}>{w}</li>
          ))}
        </ul>
      )}
    </div>
  );
}
