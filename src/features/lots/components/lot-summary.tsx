import type { LotDetail } from '../../../../shared/api/lots.ts';
import { DRY_BAG_LABELS } from '../../../../shared/api/lots.ts';
import { describeDataIdentifier } from '../../../../shared/domain/labels/index.ts';
import { Notice } from '../../../components/ui/notice.tsx';
import { Panel } from '../../../components/ui/page.tsx';
import { formatDateTime } from './format.ts';

function Row({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="contents">
      <dt className="text-ink-soft">{label}</dt>
      <dd className="font-medium text-ink">{children ?? '—'}</dd>
    </div>
  );
}

const APPROVAL_TEXT = { approved: 'approved', conditional: 'conditionally approved', 'not-approved': 'not approved' } as const;

/** Everything recorded when the lot was received, and the label as scanned. */
export function LotSummary({ lot }: { lot: LotDetail }) {
  const p = lot.partType;
  return (
    <div className="flex flex-col gap-4">
      <Panel title="Lot">
        <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-1.5 text-sm" data-testid="lot-fields">
          <Row label="Part type">
            <span className="font-mono">{p.partNumber}</span> — {p.description} ({p.polarity}, {p.packageName})
          </Row>
          <Row label="Supplier">
            {lot.supplier.name} ({lot.supplier.code}), {APPROVAL_TEXT[lot.supplier.approval]}
          </Row>
          <Row label="Quantity">{lot.quantity.toLocaleString()} pcs</Row>
          <Row label="Purchase order">{lot.purchaseOrder}</Row>
          <Row label="Supplier part number">{lot.supplierPartNumber}</Row>
          <Row label="Supplier lot">{lot.supplierLot}</Row>
          <Row label="Date code">{lot.dateCode}</Row>
          <Row label="Country of origin">{lot.countryOfOrigin}</Row>
          <Row label="MSL on the label">{lot.msl ? (lot.msl === 'not-classified' ? 'not classified' : `MSL ${lot.msl}`) : `not on the label (part type: ${p.msl})`}</Row>
          <Row label="Dry bag">
            {DRY_BAG_LABELS[lot.dryBag]}
            {lot.bagOpenedAt ? `, ${formatDateTime(lot.bagOpenedAt)}` : ''}
          </Row>
          <Row label="Received">
            {formatDateTime(lot.receivedAt)} by {lot.receivedBy.name}
          </Row>
        </dl>
        {lot.override && (
          <div className="mt-3">
            <Notice tone="hold" title={`Supplier approval overridden by ${lot.override.by.name}`}>
              {lot.override.reason}
            </Notice>
          </div>
        )}
      </Panel>
      {lot.label && (
        <Panel title="Supplier label as scanned">
          <table className="w-full text-sm">
            <caption className="sr-only">Data elements of the supplier label</caption>
            <thead className="text-left text-xs uppercase tracking-wide text-ink-soft">
              <tr>
                <th scope="col" className="py-1 pr-3">DI</th>
                <th scope="col" className="py-1 pr-3">Value</th>
                <th scope="col" className="py-1">Meaning (ANSI MH10.8.2)</th>
              </tr>
            </thead>
            <tbody>
              {lot.label.elements.map((e, i) => (
                <tr key={`${e.di}-${i}`} className="border-t border-rule/70">
                  <td className="py-1 pr-3 font-mono font-bold">{e.di}</td>
                  <td className="py-1 pr-3 font-mono">{e.value}</td>
                  <td className="py-1 text-ink-soft">{describeDataIdentifier(e.di) ?? 'not described here'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </Panel>
      )}
    </div>
  );
}
