import { Link } from 'react-router-dom';
import type { LotKitRow } from '../../../../shared/api/pairing.ts';
import { Notice } from '../../../components/ui/notice.tsx';
import { Loading, Panel } from '../../../components/ui/page.tsx';
import { ScrollBox } from '../../../components/ui/scroll-box.tsx';
import { useLotKits } from '../api/get-lot-kits.ts';
import { formatDateTime } from './format.ts';
import { KitStatusTag } from './kit-status-tag.tsx';

function pulledWhen(k: LotKitRow): string {
  if (!k.firstPulledAt || !k.lastPulledAt) return 'not yet';
  const first = formatDateTime(k.firstPulledAt);
  const last = formatDateTime(k.lastPulledAt);
  return first === last ? first : `${first} – ${last}`;
}

/**
 * Traceability from a lot forward: the kits that hold parts of it (reserved or pulled), with how
 * many of this lot's parts each holds and when they were pulled. The kit code opens the kit when
 * the role has Pairing (`kitHref`); otherwise it is shown as text.
 */
export function LotKitsPanel({ lotId, lotCode, kitHref }: { lotId: number; lotCode: string; kitHref: ((kitId: number) => string) | null }) {
  const q = useLotKits(lotId);
  return (
    <Panel title="Kits with parts of this lot">
      {q.isLoading ? (
        <Loading label="Loading the kits…" />
      ) : q.isError || !q.data ? (
        <Notice tone="fail" title="The kits could not be loaded">
          {(q.error as Error | null)?.message}
        </Notice>
      ) : q.data.length === 0 ? (
        <p className="text-sm text-ink-soft" data-testid="lot-kits-empty">
          No kit holds parts of lot {lotCode}. Parts go into kits in Pairing once the lot is screened into containers with numbered positions.
        </p>
      ) : (
        <ScrollBox label={`Kits with parts of lot ${lotCode}`}>
          <table className="w-full min-w-[32rem] text-sm">
            <caption className="sr-only">Kits with parts of lot {lotCode}</caption>
            <thead className="text-left text-xs uppercase tracking-wide text-ink-soft">
              <tr>
                <th scope="col" className="py-1 pr-3">
                  Kit
                </th>
                <th scope="col" className="py-1 pr-3">
                  Status
                </th>
                <th scope="col" className="py-1 pr-3 text-right">
                  Parts of this lot
                </th>
                <th scope="col" className="py-1 pr-3">
                  Pulled
                </th>
                <th scope="col" className="py-1">
                  Requested
                </th>
              </tr>
            </thead>
            <tbody>
              {q.data.map((k) => (
                <tr key={k.kitId} className="border-t border-rule/70">
                  <td className="whitespace-nowrap py-1.5 pr-3 font-mono font-semibold">
                    {kitHref ? (
                      <Link to={kitHref(k.kitId)} className="underline underline-offset-2">
                        {k.code}
                      </Link>
                    ) : (
                      k.code
                    )}
                  </td>
                  <td className="py-1.5 pr-3">
                    <KitStatusTag status={k.status} />
                  </td>
                  <td className="num whitespace-nowrap py-1.5 pr-3 text-right">
                    {k.parts} <span className="text-ink-soft">({k.pulled} pulled)</span>
                  </td>
                  <td className="num py-1.5 pr-3">{pulledWhen(k)}</td>
                  <td className="py-1.5">
                    <span className="num">{formatDateTime(k.createdAt)}</span> <span className="text-ink-soft">· {k.createdByName}</span>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollBox>
      )}
    </Panel>
  );
}
