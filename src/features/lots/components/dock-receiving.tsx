import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import type { ParseLabelResponse } from '../../../../shared/api/labels.ts';
import type { LotDetail } from '../../../../shared/api/lots.ts';
import type { Role } from '../../../../shared/api/roles.ts';
import { Notice } from '../../../components/ui/notice.tsx';
import { Panel } from '../../../components/ui/page.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useReceivingOptions } from '../api/get-receiving-options.ts';
import { useParseLabel } from '../api/parse-label.ts';
import { ParsedLabel } from './parsed-label.tsx';
import { ReceiveLotForm } from './receive-lot-form.tsx';
import { ScanField } from './scan-field.tsx';

function PlainCode({ parsed, lotHref }: { parsed: ParseLabelResponse; lotHref: (id: number) => string }) {
  const code = parsed.plainCode;
  switch (parsed.plainCodeKind) {
    case 'lot':
      return parsed.lot ? (
        <Notice tone="info" title={`Our lot ${parsed.lot.code}`}>
          <Link to={lotHref(parsed.lot.lotId)} className="font-semibold underline">
            Open lot {parsed.lot.code}
          </Link>
        </Notice>
      ) : (
        <Notice tone="hold" title="Lot code not found">
          {code} has the form of our lot code, but no such lot exists.
        </Notice>
      );
    case 'container':
      return <Notice tone="info" title={`Container ${code}`}>This is one of our bin containers, not a supplier label. Containers are handled in Bins.</Notice>;
    case 'purchaseOrder':
      return <Notice tone="info" title={`Purchase order ${code}`}>Filled in below; choose the supplier and part type and type the quantity.</Notice>;
    default:
      return (
        <Notice tone="hold" title="Not a supplier label">
          “{code}” is neither an ISO/IEC 15434 label, one of our codes, nor a PO number. Check the scanner’s separator setting, or fill the form by hand.
        </Notice>
      );
  }
}

/** Scan → what the label says → the receiving form, filled and editable. */
export function DockReceiving({ role, lotHref, onReceived }: { role: Role; lotHref: (id: number) => string; onReceived: (lot: LotDetail) => void }) {
  const parse = useParseLabel();
  const options = useReceivingOptions();
  const [scan, setScan] = useState<{ n: number; parsed: ParseLabelResponse | null }>({ n: 0, parsed: null });
  const parseError = parse.error instanceof ApiError ? parse.error : null;

  const navigate = useNavigate();
  const onScan = (text: string) =>
    parse.mutate(text, {
      onSuccess: (parsed) => {
        // One of our container codes opens that container in Bins.
        if (parsed.format === null && parsed.plainCodeKind === 'container' && parsed.plainCode) return navigate(`/bins/containers/code/${encodeURIComponent(parsed.plainCode)}`);
        setScan((s) => ({ n: s.n + 1, parsed }));
      },
    });

  const parsed = scan.parsed;
  return (
    <div className="grid gap-5 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
      <div className="flex flex-col gap-4">
        <Panel>
          <ScanField onScan={onScan} busy={parse.isPending} />
        </Panel>
        {parseError && (
          <Notice tone="fail" title="The label could not be read">
            {parseError.problem.detail}
          </Notice>
        )}
        {parsed && !parse.isError && parsed.format === null && <PlainCode parsed={parsed} lotHref={lotHref} />}
        {parsed && parsed.format !== null && (
          <Panel title="Label read">
            <ParsedLabel parsed={parsed} />
          </Panel>
        )}
        {options.isError && <Notice tone="fail" title="Suppliers and part types could not be loaded">{(options.error as Error).message}</Notice>}
      </div>
      <Panel title="Receive a lot">
        <ReceiveLotForm key={scan.n} parsed={parsed} options={options.data} role={role} lotHref={lotHref} onReceived={onReceived} />
      </Panel>
    </div>
  );
}
