import { PageHeader } from '../../../components/ui/page.tsx';
import { BenchQueueTable } from '../../../features/bench-queue/components/bench-queue-table.tsx';
import { AREA_PURPOSE } from '../../areas.ts';
import { RequireArea } from '../require-area.tsx';

/** /bench — the lots waiting for inspection. */
export function BenchQueuePage() {
  return (
    <RequireArea area="bench">
      <PageHeader title="Bench" subtitle={AREA_PURPOSE.bench} />
      <BenchQueueTable />
    </RequireArea>
  );
}
