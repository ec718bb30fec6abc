import { Link, useParams } from 'react-router-dom';
import { canUseArea } from '../../../../shared/api/roles.ts';
import { Notice } from '../../../components/ui/notice.tsx';
import { Loading, PageHeader } from '../../../components/ui/page.tsx';
import { useContainer } from '../../../features/bins/api/get-container.ts';
import { ContainerDetailView } from '../../../features/bins/components/container-detail.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { RequireArea } from '../require-area.tsx';
import { useSessionUser } from '../use-session-user.ts';

/** /bins/containers/:id — one container: its bin, positions with each part's readings, history. */
export function ContainerPage() {
  const user = useSessionUser();
  const id = Number(useParams().id);
  const q = useContainer(id);
  const canEdit = user.role === 'inspector' || user.role === 'quality';
  const lotHref = canUseArea(user.role, 'dock') ? (lotId: number) => `/dock/lots/${lotId}` : null;
  return (
    <RequireArea area="bins">
      <p className="mb-2 text-sm">
        <Link to="/bins" className="text-ink-soft hover:text-ink hover:underline">
          ← Bins
        </Link>
      </p>
      {!Number.isSafeInteger(id) || id < 1 ? (
        <Notice tone="fail" title="No such container">The address does not name a container.</Notice>
      ) : q.isLoading ? (
        <Loading label="Loading the container…" />
      ) : q.isError || !q.data ? (
        <Notice tone="fail" title={q.error instanceof ApiError && q.error.status === 404 ? 'Container not found' : 'The container could not be loaded'}>
          {(q.error as Error | null)?.message}
        </Notice>
      ) : (
        <>
          <PageHeader title={`Container ${q.data.code}`} subtitle={`${q.data.partNumber} · lot ${q.data.lotCode}`} />
          <ContainerDetailView detail={q.data} canEdit={canEdit} lotHref={lotHref} />
        </>
      )}
    </RequireArea>
  );
}
