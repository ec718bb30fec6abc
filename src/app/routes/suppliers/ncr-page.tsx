import { Link, useParams } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice.tsx';
import { EmptyState, Loading, PageHeader } from '../../../components/ui/page.tsx';
import { useNcr } from '../../../features/ncrs/api/get-ncr.ts';
import { NcrDetailView } from '../../../features/ncrs/components/ncr-detail.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { RequireArea } from '../require-area.tsx';
import { SuppliersTabs, supplierPaths } from './suppliers-tabs.tsx';

export function NcrPage() {
  const id = Number(useParams().id);
  const q = useNcr(id);
  let body;
  if (!Number.isInteger(id) || id < 1 || (q.error instanceof ApiError && q.error.status === 404)) {
    body = (
      <EmptyState title="No such NCR">
        <Link to={supplierPaths.ncrs} className="font-semibold underline">
          Back to the NCRs
        </Link>
      </EmptyState>
    );
  } else if (q.isLoading) {
    body = <Loading label="Loading the NCR…" />;
  } else if (q.isError || !q.data) {
    body = <Notice tone="fail" title="The NCR could not be loaded">{(q.error as Error | null)?.message}</Notice>;
  } else {
    body = (
      <>
        <PageHeader
          title={q.data.code}
          subtitle={`Nonconformance report to ${q.data.supplier.name}`}
          actions={
            <Link to={supplierPaths.ncrs} className="self-center text-sm font-semibold text-ink-soft underline-offset-2 hover:underline">
              ‹ All NCRs
            </Link>
          }
        />
        <NcrDetailView ncr={q.data} canAct />
      </>
    );
  }
  return (
    <RequireArea area="suppliers">
      <SuppliersTabs />
      {body}
    </RequireArea>
  );
}
