import { Link } from 'react-router-dom';
import { AREAS_BY_ROLE, AREA_LABELS, ROLE_LABELS } from '../../../shared/api/roles.ts';
import { Notice } from '../../components/ui/notice.tsx';
import { PageHeader } from '../../components/ui/page.tsx';
import { AREA_PATH, AREA_PURPOSE } from '../areas.ts';
import { useSessionUser } from './use-session-user.ts';

const ROLE_INTRO = {
  inspector: 'Receive lots at the dock, measure parts at the bench and propose dispositions.',
  quality: 'Own part specifications, bin schemes and sampling settings; sign dispositions; manage users.',
  buyer: 'Follow supplier lot quality, raise nonconformance reports and plan order quantities.',
  assembler: 'Request matched sets, pull the parts on the pick list and confirm each pull by scanning.',
} as const;

export function HomePage() {
  const user = useSessionUser();
  return (
    <div>
      <PageHeader title={`Good to see you, ${user.name.split(' ')[0]}`} subtitle={`${ROLE_LABELS[user.role]} — ${ROLE_INTRO[user.role]}`} />
      <h2 className="mb-3 text-sm font-bold uppercase tracking-wide text-ink-soft">Your areas</h2>
      <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3" data-testid="home-areas">
        {AREAS_BY_ROLE[user.role].map((area) => (
          <li key={area}>
            <Link
              to={AREA_PATH[area]}
              className="block h-full rounded-lg border border-rule bg-panel p-4 transition-colors hover:border-copper focus-visible:border-copper"
            >
              <span className="text-base font-bold text-ink">{AREA_LABELS[area]}</span>
              <span className="mt-1 block text-sm text-ink-soft">{AREA_PURPOSE[area]}</span>
            </Link>
          </li>
        ))}
      </ul>
      {(user.role === 'inspector' || user.role === 'quality' || user.role === 'assembler') && (
        <div className="mt-6 grid gap-3 lg:grid-cols-2">
          <Notice tone="hold" title="Handle parts at an ESD-protected workstation">
            Ground yourself (wrist strap when seated) and keep parts in ESD-safe packaging, as your site's ANSI/ESD S20.20
            programme requires.
          </Notice>
          <Notice tone="hold" title="Test fixtures can carry dangerous voltages">
            Curve tracers and breakdown tests apply high voltages. Follow your bench's procedures and local rules.
          </Notice>
        </div>
      )}
    </div>
  );
}
