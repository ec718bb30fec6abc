import { Link, useParams } from 'react-router-dom';
import { canUseArea } from '../../../../shared/api/roles.ts';
import { Notice } from '../../../components/ui/notice.tsx';
import { Loading, PageHeader } from '../../../components/ui/page.tsx';
import { useKit } from '../../../features/kits/api/get-kit.ts';
import { KitDetailView } from '../../../features/kits/components/kit-detail-view.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { RequireArea } from '../require-area.tsx';
import { useSessionUser } from '../use-session-user.ts';
import { pairingPaths } from './pairing-tabs.tsx';

/** /pairing/kits/:id — one kit: pick list in storage order, pull by scanning, sets, source lots. */
export function KitPage() {
  const user = useSessionUser();
  const id = Number(useParams().id);
  const q = useKit(id);
  const canEdit = user.role === 'assembler' || user.role === 'quality';
  const lotHref = canUseArea(user.role, 'dock') ? (lotId: number) => `/dock/lots/${lotId}` : null;
  return (
    <RequireArea area="pairing">
      <p className="mb-2 text-sm">
        <Link to={pairingPaths.kits} className="text-ink-soft hover:text-ink hover:underline">
          ← Pairing
        </Link>
      </p>
      {!Number.isSafeInteger(id) || id < 1 ? (
        <Notice tone="fail" title="No such kit">
          The address does not name a kit.
        </Notice>
      ) : q.isLoading ? (
        <Loading label="Loading the kit…" />
      ) : q.isError || !q.data ? (
        <Notice tone="fail" title={q.error instanceof ApiError && q.error.status === 404 ? 'Kit not found' : 'The kit could not be loaded'}>
          {(q.error as Error | null)?.message}
        </Notice>
      ) : (
        <>
          <PageHeader title={`Kit ${q.data.code}`} subtitle={q.data.partTypes.map((p) => `${p.partNumber} (${p.polarity})`).join(' + ')} />
          <KitDetailView kit={q.data} canEdit={canEdit} lotHref={lotHref} />
        </>
      )}
    </RequireArea>
  );
}
