import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { AREA_LABELS, ROLE_LABELS, canUseArea, type Area } from '../../../shared/api/roles.ts';
import { Notice } from '../../components/ui/notice.tsx';
import { useSessionUser } from './use-session-user.ts';

/** Shows the page only to roles that may use the area. The server checks again on every call. */
export function RequireArea({ area, children }: { area: Area; children: ReactNode }) {
  const user = useSessionUser();
  if (!canUseArea(user.role, area)) {
    return (
      <div className="max-w-xl">
        <Notice tone="hold" title={`${AREA_LABELS[area]} is not part of your role`}>
          You are signed in as {ROLE_LABELS[user.role].toLowerCase()}. Ask a quality engineer if you need access.{' '}
          <Link to="/" className="font-semibold underline">
            Back to your start page
          </Link>
        </Notice>
      </div>
    );
  }
  return <>{children}</>;
}
