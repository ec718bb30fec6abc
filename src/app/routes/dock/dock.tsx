import { useNavigate } from 'react-router-dom';
import { PageHeader, Panel } from '../../../components/ui/page.tsx';
import { DockReceiving } from '../../../features/lots/components/dock-receiving.tsx';
import { LotsTable } from '../../../features/lots/components/lots-table.tsx';
import { ScannerSettingsForm } from '../../../features/scanner-settings/components/scanner-settings-form.tsx';
import { AREA_PURPOSE } from '../../areas.ts';
import { RequireArea } from '../require-area.tsx';
import { useSessionUser } from '../use-session-user.ts';

export const lotHref = (id: number) => `/dock/lots/${id}`;

/** Dock: scan a label, receive the lot, and the list of received lots below. */
export function DockPage() {
  const user = useSessionUser();
  const navigate = useNavigate();
  return (
    <RequireArea area="dock">
      <PageHeader title="Dock" subtitle={AREA_PURPOSE.dock} />
      <DockReceiving role={user.role} lotHref={lotHref} onReceived={(lot) => navigate(lotHref(lot.id))} />
      <h2 className="mb-3 mt-8 text-base font-bold text-ink">Received lots</h2>
      <LotsTable lotHref={lotHref} />
      {user.role === 'quality' && (
        <details className="mt-8">
          <summary className="cursor-pointer text-sm font-semibold text-ink-soft">Scanner separator settings (quality engineers)</summary>
          <Panel className="mt-3">
            <ScannerSettingsForm />
          </Panel>
        </details>
      )}
    </RequireArea>
  );
}
