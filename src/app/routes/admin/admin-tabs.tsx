import { NavLink } from 'react-router-dom';

export function AdminTabs() {
  const tab = ({ isActive }: { isActive: boolean }) =>
    `rounded-md px-3 py-1.5 text-sm font-semibold ${isActive ? 'bg-ink text-white' : 'text-ink-soft hover:bg-panel'}`;
  return (
    <nav aria-label="Admin sections" className="mb-4 flex gap-2">
      <NavLink to="/admin/users" className={tab}>
        Users
      </NavLink>
      <NavLink to="/admin/audit" className={tab}>
        Audit trail
      </NavLink>
      <NavLink to="/admin/mail" className={tab}>
        Outgoing mail
      </NavLink>
    </nav>
  );
}
