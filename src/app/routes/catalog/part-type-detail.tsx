import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { PartTypeDetail } from '../../../../shared/api/catalog.ts';
import { ESD_CAUTION_TEXT } from '../../../../shared/domain/esd/index.ts';
import { FLOOR_LIFE_CONDITIONS, MSL_FLOOR_LIFE } from '../../../../shared/domain/moisture/index.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { EmptyState, Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { usePartType } from '../../../features/part-types/api/get-part-type.ts';
import { BinSchemePanel } from '../../../features/part-types/components/bin-scheme-panel.tsx';
import { PartTypeForm } from '../../../features/part-types/components/part-type-form.tsx';
import { PartTypeSpec } from '../../../features/part-types/components/part-type-spec.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { RequireArea } from '../require-area.tsx';
import { useSessionUser } from '../use-session-user.ts';
import { CatalogTabs, catalogPaths } from './catalog-tabs.tsx';

function HandlingCautions({ part }: { part: PartTypeDetail }) {
  const msl = part.msl === 'not-classified' || part.msl === '1' ? null : MSL_FLOOR_LIFE[part.msl];
  return (
    <div className="mb-4 grid gap-2 lg:grid-cols-2">
      <Notice tone="hold" title={`ESD${part.esdHbmClass ? ` — HBM class ${part.esdHbmClass}` : ''}`}>
        {ESD_CAUTION_TEXT}
      </Notice>
      {msl && (
        <Notice tone="hold" title={`Moisture sensitive — MSL ${part.msl.toUpperCase()}`}>
          Floor life after the dry bag is opened: {msl.description} at {FLOOR_LIFE_CONDITIONS} (J-STD-033). Once it has run out the
          parts need a bake before soldering; follow your site's moisture-control procedure.
        </Notice>
      )}
    </div>
  );
}

export function CatalogPartTypeDetailPage() {
  const user = useSessionUser();
  const canEdit = user.role === 'quality';
  const id = Number(useParams().id);
  const q = usePartType(id);
  const [editing, setEditing] = useState(false);

  let body;
  if (!Number.isInteger(id) || id < 1 || (q.error instanceof ApiError && q.error.status === 404)) {
    body = (
      <EmptyState title="No such part type">
        <Link to={catalogPaths.partTypes} className="font-semibold underline">
          Back to the part types
        </Link>
      </EmptyState>
    );
  } else if (q.isLoading) {
    body = <Loading label="Loading the part type…" />;
  } else if (q.isError || !q.data) {
    body = <Notice tone="fail" title="The part type could not be loaded">{(q.error as Error | null)?.message}</Notice>;
  } else {
    const part = q.data;
    body = (
      <>
        <PageHeader
          title={part.partNumber}
          subtitle={
            <span className="flex flex-wrap items-center gap-2">
              {part.description}
              <StatusTag tone="neutral">{part.polarity}</StatusTag>
              {part.active ? <StatusTag tone="pass">Active</StatusTag> : <StatusTag tone="neutral">Inactive</StatusTag>}
            </span>
          }
          actions={
            <>
              <Link to={catalogPaths.partTypes} className="self-center text-sm font-semibold text-ink-soft underline-offset-2 hover:underline">
                ‹ All part types
              </Link>
              {canEdit && !editing && <Button onClick={() => setEditing(true)}>Edit specification</Button>}
            </>
          }
        />
        <HandlingCautions part={part} />
        <div className="flex flex-col gap-5">
          <Panel title="Specification">
            {editing ? (
              <PartTypeForm initial={part} onDone={() => setEditing(false)} onCancel={() => setEditing(false)} />
            ) : (
              <PartTypeSpec part={part} supplierPath={catalogPaths.supplier} />
            )}
          </Panel>
          <Panel title="Gain-bin scheme">
            <BinSchemePanel part={part} canEdit={canEdit} />
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
