import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Button } from '../../../components/ui/button.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { EmptyState, Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { usePartTypes } from '../../../features/part-types/api/get-part-types.ts';
import { useSupplier } from '../../../features/suppliers/api/get-supplier.ts';
import { SupplierApproval } from '../../../features/suppliers/components/supplier-approval.tsx';
import { SupplierContacts } from '../../../features/suppliers/components/supplier-contacts.tsx';
import { SupplierForm } from '../../../features/suppliers/components/supplier-form.tsx';
import { SupplierParts } from '../../../features/suppliers/components/supplier-parts.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { RequireArea } from '../require-area.tsx';
import { useSessionUser } from '../use-session-user.ts';
import { CatalogTabs, catalogPaths } from './catalog-tabs.tsx';

export function CatalogSupplierDetailPage() {
  const user = useSessionUser();
  const canEdit = user.role === 'quality';
  const id = Number(useParams().id);
  const q = useSupplier(id);
  const [editing, setEditing] = useState(false);
  // Options for the mapping form: the page composes the part-types feature with the suppliers feature.
  const parts = usePartTypes({ page: 1, pageSize: 200, active: 'true', sort: 'partNumber', dir: 'asc' });
  const partTypeOptions = (parts.data?.items ?? []).map((p) => ({ id: p.id, label: `${p.partNumber} — ${p.polarity}, ${p.description}` }));

  let body;
  if (!Number.isInteger(id) || id < 1 || (q.error instanceof ApiError && q.error.status === 404)) {
    body = (
      <EmptyState title="No such supplier">
        <Link to={catalogPaths.suppliers} className="font-semibold underline">
          Back to the suppliers
        </Link>
      </EmptyState>
    );
  } else if (q.isLoading) {
    body = <Loading label="Loading the supplier…" />;
  } else if (q.isError || !q.data) {
    body = <Notice tone="fail" title="The supplier could not be loaded">{(q.error as Error | null)?.message}</Notice>;
  } else {
    const s = q.data;
    body = (
      <>
        <PageHeader
          title={s.name}
          subtitle={<span className="num">Supplier code {s.code}</span>}
          actions={
            <Link to={catalogPaths.suppliers} className="self-center text-sm font-semibold text-ink-soft underline-offset-2 hover:underline">
              ‹ All suppliers
            </Link>
          }
        />
        <div className="grid gap-5 lg:grid-cols-2">
          <Panel title="Approval">
            <SupplierApproval key={s.approval} supplier={s} canEdit={canEdit} />
          </Panel>
          <Panel title="Details">
            {editing ? (
              <SupplierForm initial={s} onDone={() => setEditing(false)} onCancel={() => setEditing(false)} />
            ) : (
              <div className="flex flex-col gap-2 text-sm">
                <p className="whitespace-pre-line text-ink">{s.notes ?? <span className="text-ink-faint">No notes.</span>}</p>
                {canEdit && (
                  <div>
                    <Button onClick={() => setEditing(true)}>Edit name, code and notes</Button>
                  </div>
                )}
              </div>
            )}
          </Panel>
          <Panel title="Contacts">
            <SupplierContacts supplierId={s.id} contacts={s.contacts} canEdit={canEdit} />
          </Panel>
          <Panel title="Part numbers">
            <SupplierParts supplierId={s.id} parts={s.parts} canEdit={canEdit} partTypeOptions={partTypeOptions} partPath={catalogPaths.partType} />
          </Panel>
        </div>
      </>
    );
  }

  return (
    <RequireArea area="catalog">
      <CatalogTabs />
      {body}
    </RequireArea>
  );
}
