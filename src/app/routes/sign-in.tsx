import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { Loading } from '../../components/ui/page.tsx';
import { useMe } from '../../features/auth/api/get-me.ts';
import { SignInForm } from '../../features/auth/components/sign-in-form.tsx';

export function SignInPage() {
  const me = useMe();
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const next = params.get('next')?.startsWith('/') ? params.get('next')! : '/';
  if (me.isLoading) return <Loading />;
  if (me.data) return <Navigate to={next} replace />;
  return (
    <main className="grid min-h-screen place-items-center bg-slate-bar px-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex items-center gap-3 text-white">
          <Logo />
          <div>
            <p className="text-2xl font-bold tracking-tight">Binwright</p>
            <p className="text-sm text-white/70">Incoming inspection and gain sorting for bipolar transistors</p>
          </div>
        </div>
        <div className="rounded-lg bg-panel p-6 shadow-lg">
          <h1 className="mb-4 text-lg font-bold">Sign in</h1>
          <SignInForm onSignedIn={() => navigate(next, { replace: true })} />
        </div>
        <p className="mt-4 text-xs text-white/60">Accounts are issued by your quality engineer.</p>
      </div>
    </main>
  );
}

export function Logo({ size = 40 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 32 32" aria-hidden>
      <rect width="32" height="32" rx="6" fill="#b5652b" />
      <path d="M9 8v16M9 16h6M15 16l8-6M15 16l8 6" stroke="#fff" strokeWidth="2.5" fill="none" strokeLinecap="round" />
    </svg>
  );
}
