import { Navigate, NavLink, Outlet, useLocation, useNavigate } from 'react-router-dom';
import { AREAS_BY_ROLE, AREA_LABELS, ROLE_LABELS } from '../../../shared/api/roles.ts';
import { Button } from '../../components/ui/button.tsx';
import { Loading } from '../../components/ui/page.tsx';
import { Notice } from '../../components/ui/notice.tsx';
import { useMe } from '../../features/auth/api/get-me.ts';
import { useLogout } from '../../features/auth/api/logout.ts';
import { AREA_PATH } from '../areas.ts';
import { Logo } from './sign-in.tsx';

export function AppLayout() {
  const me = useMe();
  const logout = useLogout();
  const location = useLocation();
  const navigate = useNavigate();

  if (me.isLoading) return <Loading label="Checking your session…" />;
  if (me.isError)
    return (
      <main className="mx-auto max-w-lg p-8">
        <Notice tone="fail" title="The server could not be reached">Check that Binwright is running, then reload.</Notice>
      </main>
    );
  if (!me.data) return <Navigate to={`/sign-in?next=${encodeURIComponent(location.pathname)}`} replace />;
  const user = me.data;

  return (
    <div className="flex min-h-screen flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-10 focus:bg-panel focus:p-2">
        Skip to content
      </a>
      <header className="bg-slate-bar text-white">
        <div className="mx-auto flex max-w-[1400px] flex-wrap items-center gap-x-6 px-4">
          <NavLink to="/" className="flex items-center gap-2 py-2.5 font-bold tracking-tight">
            <Logo size={26} />
            Binwright
          </NavLink>
          {/* Narrow screens: the areas get a row of their own under the name and the user. */}
          <nav aria-label="Areas" className="order-last -mx-3 flex basis-full gap-1 overflow-x-auto sm:order-none sm:mx-0 sm:flex-1 sm:basis-auto">
            {AREAS_BY_ROLE[user.role].map((area) => (
              <NavLink
                key={area}
                to={AREA_PATH[area]}
                className={({ isActive }) =>
                  `border-b-2 px-3 py-3 text-sm font-semibold transition-colors ${
                    isActive || (area === 'admin' && location.pathname.startsWith('/admin'))
                      ? 'border-copper text-white'
                      : 'border-transparent text-white/75 hover:bg-slate-hover hover:text-white'
                  }`
                }
              >
                {AREA_LABELS[area]}
              </NavLink>
            ))}
          </nav>
          <div className="ml-auto flex items-center gap-3 text-sm sm:ml-0">
            <span className="text-right leading-tight">
              <span className="block font-semibold" data-testid="user-name">{user.name}</span>
              <span className="block text-xs text-white/70" data-testid="user-role">{ROLE_LABELS[user.role]}</span>
            </span>
            <Button
              variant="quiet"
              className="text-white/80 hover:bg-slate-hover hover:text-white"
              busy={logout.isPending}
              onClick={() => logout.mutate(undefined, { onSettled: () => navigate('/sign-in', { replace: true }) })}
            >
              Sign out
            </Button>
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-[1400px] flex-1 px-4 py-6">
        <Outlet context={user} />
      </main>
      <footer className="border-t border-rule px-4 py-3 text-center text-xs text-ink-faint">
        Binwright recommends; qualified people decide. Follow your site's ESD, moisture and test-bench procedures.
      </footer>
    </div>
  );
}
