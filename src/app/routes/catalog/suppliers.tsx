import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { Button } from '../../../components/ui/button.tsx';
import { PageHeader, Panel } from '../../../components/ui/page.tsx';
import { SupplierForm } from '../../../features/suppliers/components/supplier-form.tsx';
import { SuppliersTable } from '../../../features/suppliers/components/suppliers-table.tsx';
import { AREA_PURPOSE } from '../../areas.ts';
import { RequireArea } from '../require-area.tsx';
import { useSessionUser } from '../use-session-user.ts';
import { CatalogTabs, ReadOnlyNote, catalogPaths } from './catalog-tabs.tsx';

export function CatalogSuppliersPage() {
  const user = useSessionUser();
  const canEdit = user.role === 'quality';
  const [creating, setCreating] = useState(false);
  const navigate = useNavigate();
  return (
    <RequireArea area="catalog">
      <PageHeader
        title="Catalog"
        subtitle={AREA_PURPOSE.catalog}
        actions={
          canEdit && !creating ? (
            <Button variant="primary" onClick={() => setCreating(true)}>
              New supplier
            </Button>
          ) : undefined
        }
      />
      <CatalogTabs />
      {!canEdit && <ReadOnlyNote />}
      <div className={creating ? 'grid gap-5 lg:grid-cols-[1fr_22rem]' : ''}>
        <SuppliersTable detailPath={catalogPaths.supplier} />
        {canEdit && creating && (
          <Panel title="New supplier">
            <SupplierForm onDone={(s) => navigate(catalogPaths.supplier(s.id))} onCancel={() => setCreating(false)} />
          </Panel>
        )}
      </div>
    </RequireArea>
  );
}
