import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { Button } from '../../../components/ui/button.tsx';
import { PageHeader, Panel } from '../../../components/ui/page.tsx';
import { PartTypeForm } from '../../../features/part-types/components/part-type-form.tsx';
import { PartTypesTable } from '../../../features/part-types/components/part-types-table.tsx';
import { AREA_PURPOSE } from '../../areas.ts';
import { RequireArea } from '../require-area.tsx';
import { useSessionUser } from '../use-session-user.ts';
import { CatalogTabs, ReadOnlyNote, catalogPaths } from './catalog-tabs.tsx';

export function CatalogPartTypesPage() {
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
              New part type
            </Button>
          ) : undefined
        }
      />
      <CatalogTabs />
      {!canEdit && <ReadOnlyNote />}
      {canEdit && creating && (
        <Panel title="New part type" className="mb-5">
          <PartTypeForm onDone={(row) => navigate(catalogPaths.partType(row.id))} onCancel={() => setCreating(false)} />
        </Panel>
      )}
      <PartTypesTable detailPath={catalogPaths.partType} />
    </RequireArea>
  );
}
