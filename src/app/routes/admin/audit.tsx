import { PageHeader } from '../../../components/ui/page.tsx';
import { AuditTable } from '../../../features/audit/components/audit-table.tsx';
import { RequireArea } from '../require-area.tsx';
import { AdminTabs } from './admin-tabs.tsx';

export function AdminAuditPage() {
  return (
    <RequireArea area="admin">
      <PageHeader title="Admin" subtitle="Every change, who made it and when. Entries cannot be edited or removed." />
      <AdminTabs />
      <AuditTable />
    </RequireArea>
  );
}
