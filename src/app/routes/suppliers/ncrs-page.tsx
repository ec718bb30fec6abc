import { useNavigate, useSearchParams } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice.tsx';
import { Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { useNcrDraft } from '../../../features/ncrs/api/get-ncr-draft.ts';
import { NcrCreateForm } from '../../../features/ncrs/components/ncr-create-form.tsx';
import { NcrsTable } from '../../../features/ncrs/components/ncrs-table.tsx';
import { RequireArea } from '../require-area.tsx';
import { SuppliersTabs, supplierPaths } from './suppliers-tabs.tsx';

function positive(v: string | null): number | null {
  const n = Number(v);
  return v !== null && Number.isInteger(n) && n > 0 ? n : null;
}

export function NcrsPage() {
  const [params, setParams] = useSearchParams();
  const navigate = useNavigate();
  const lotId = positive(params.get('lotId'));
  const alertId = positive(params.get('alertId'));
  const draft = useNcrDraft(lotId, alertId);
  return (
    <RequireArea area="suppliers">
      <PageHeader title="Suppliers" subtitle="Nonconformance reports: raised from a rejected lot or a drift alert, e-mailed to the supplier as a PDF, closed with the supplier's answer." />
      <SuppliersTabs />
      <div className={lotId ? 'grid gap-5 xl:grid-cols-[1fr_36rem]' : ''}>
        <NcrsTable detailPath={supplierPaths.ncr} />
        {lotId && (
          <Panel title="Raise a nonconformance report">
            {draft.isLoading ? (
              <Loading label="Filling the report from the lot…" />
            ) : draft.isError || !draft.data ? (
              <Notice tone="fail" title="The lot could not be read">{(draft.error as Error | null)?.message}</Notice>
            ) : (
              <NcrCreateForm draft={draft.data} onCreated={(ncr) => navigate(supplierPaths.ncr(ncr.id))} onCancel={() => setParams({})} />
            )}
          </Panel>
        )}
      </div>
    </RequireArea>
  );
}
