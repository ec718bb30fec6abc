import { Panel, PageHeader } from '../../../components/ui/page.tsx';
import { CreateUserForm } from '../../../features/users/components/create-user-form.tsx';
import { UsersTable } from '../../../features/users/components/users-table.tsx';
import { RequireArea } from '../require-area.tsx';
import { useSessionUser } from '../use-session-user.ts';
import { AdminTabs } from './admin-tabs.tsx';

export function AdminUsersPage() {
  const user = useSessionUser();
  return (
    <RequireArea area="admin">
      <PageHeader title="Admin" subtitle="Users are deactivated, never deleted, so the audit trail keeps their names." />
      <AdminTabs />
      <div className="grid grid-cols-1 gap-5 lg:grid-cols-[minmax(0,1fr)_20rem]">
        <UsersTable currentUserId={user.id} />
        <Panel title="New user">
          <CreateUserForm />
        </Panel>
      </div>
    </RequireArea>
  );
}
