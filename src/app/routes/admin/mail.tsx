import { Panel, PageHeader } from '../../../components/ui/page.tsx';
import { OutboxTable } from '../../../features/mail/components/outbox-table.tsx';
import { SinkMessages } from '../../../features/mail/components/sink-messages.tsx';
import { RequireArea } from '../require-area.tsx';
import { AdminTabs } from './admin-tabs.tsx';

export function AdminMailPage() {
  return (
    <RequireArea area="admin">
      <PageHeader title="Admin" subtitle="Outgoing mail. In this installation the SMTP server is a local sink: nothing leaves the machine." />
      <AdminTabs />
      <div className="grid grid-cols-1 gap-5 xl:grid-cols-[minmax(0,1fr)_28rem]">
        <OutboxTable />
        <Panel title="Received by the local sink">
          <SinkMessages />
        </Panel>
      </div>
    </RequireArea>
  );
}
