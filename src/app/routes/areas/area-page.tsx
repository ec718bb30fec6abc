import { AREA_LABELS, type Area } from '../../../../shared/api/roles.ts';
import { EmptyState, PageHeader } from '../../../components/ui/page.tsx';
import { AREA_PURPOSE } from '../../areas.ts';
import { RequireArea } from '../require-area.tsx';

/** An area whose screens are still being built: says what will be here, shows no data. */
export function AreaPage({ area }: { area: Area }) {
  return (
    <RequireArea area={area}>
      <PageHeader title={AREA_LABELS[area]} subtitle={AREA_PURPOSE[area]} />
      <EmptyState title={`${AREA_LABELS[area]} is being built`}>
        Nothing is recorded here yet. This area will appear as soon as it is ready; your role already has access.
      </EmptyState>
    </RequireArea>
  );
}
