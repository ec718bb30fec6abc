import { useOutletContext } from 'react-router-dom';
import type { SessionUser } from '../../../shared/api/auth.ts';

/** The signed-in user, provided by AppLayout to every page inside it. */
export function useSessionUser(): SessionUser {
  return useOutletContext<SessionUser>();
}
