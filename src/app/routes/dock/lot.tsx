import { Link, useParams } from 'react-router-dom';
import { canUseArea } from '../../../../shared/api/roles.ts';
import { Notice } from '../../../components/ui/notice.tsx';
import { Loading, PageHeader } from '../../../components/ui/page.tsx';
import { LotScreeningPanel } from '../../../features/bins/components/lot-screening-panel.tsx';
import { LotKitsPanel } from '../../../features/kits/components/lot-kits-panel.tsx';
import { useLot } from '../../../features/lots/api/get-lot.ts';
import { DocumentsPanel } from '../../../features/lots/components/documents-panel.tsx';
import { EsdCaution } from '../../../features/lots/components/esd-caution.tsx';
import { FloorLifePanel } from '../../../features/lots/components/floor-life-panel.tsx';
import { LotStatusTag } from '../../../features/lots/components/lots-table.tsx';
import { LotSummary } from '../../../features/lots/components/lot-summary.tsx';
import { TravelerPanel } from '../../../features/lots/components/traveler-panel.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { pairingPaths } from '../pairing/pairing-tabs.tsx';
import { RequireArea } from '../require-area.tsx';
import { useSessionUser } from '../use-session-user.ts';

/** One lot: what was received, floor life, ESD caution, documents, screening, the kits its parts went into, and the traveler label. */
export function LotPage() {
  const user = useSessionUser();
  const id = Number(useParams().id);
  const q = useLot(id);
  const canEdit = user.role === 'inspector' || user.role === 'quality';
  return (
    <RequireArea area="dock">
      <p className="mb-2 text-sm">
        <Link to="/dock" className="text-ink-soft hover:text-ink hover:underline">
          ← Dock
        </Link>
      </p>
      {!Number.isInteger(id) || id < 1 ? (
        <Notice tone="fail" title="No such lot">The address does not name a lot.</Notice>
      ) : q.isLoading ? (
        <Loading label="Loading the lot…" />
      ) : q.isError || !q.data ? (
        <Notice tone="fail" title={q.error instanceof ApiError && q.error.status === 404 ? 'Lot not found' : 'The lot could not be loaded'}>
          {(q.error as Error | null)?.message}
        </Notice>
      ) : (
        <>
          <PageHeader
            title={`Lot ${q.data.code}`}
            subtitle={
              <span className="inline-flex flex-wrap items-center gap-2">
                <LotStatusTag status={q.data.status} />
                {q.data.partType.partNumber} from {q.data.supplier.name} · {q.data.quantity.toLocaleString()} pcs
              </span>
            }
          />
          <div className="grid grid-cols-1 gap-5 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
            <div className="flex flex-col gap-5">
              <LotSummary lot={q.data} />
              <DocumentsPanel lot={q.data} canUpload={canEdit} />
              <LotScreeningPanel
                lotId={q.data.id}
                canEdit={canEdit}
                containerHref={(cid) => `/bins/containers/${cid}`}
                benchHref={canUseArea(user.role, 'bench') ? `/bench/lots/${q.data.id}` : null}
              />
              <LotKitsPanel lotId={q.data.id} lotCode={q.data.code} kitHref={canUseArea(user.role, 'pairing') ? pairingPaths.kit : null} />
            </div>
            <div className="flex flex-col gap-5">
              <EsdCaution lot={q.data} />
              <FloorLifePanel lot={q.data} canEdit={canEdit} />
              <TravelerPanel lotId={q.data.id} code={q.data.code} />
            </div>
          </div>
        </>
      )}
    </RequireArea>
  );
}
