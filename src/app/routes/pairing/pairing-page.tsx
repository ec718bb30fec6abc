import { useNavigate } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice.tsx';
import { Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { usePairingStock } from '../../../features/kits/api/get-pairing-stock.ts';
import { KitRequestForm } from '../../../features/kits/components/kit-request-form.tsx';
import { KitsTable } from '../../../features/kits/components/kits-table.tsx';
import { RequireArea } from '../require-area.tsx';
import { useSessionUser } from '../use-session-user.ts';
import { PairingTabs, pairingPaths } from './pairing-tabs.tsx';

/** /pairing — request matched sets from stock: plan, reserve, and the kits so far. */
export function PairingPage() {
  const user = useSessionUser();
  const navigate = useNavigate();
  const stock = usePairingStock();
  const canEdit = user.role === 'assembler' || user.role === 'quality';
  return (
    <RequireArea area="pairing">
      <PageHeader title="Pairing" subtitle="Matched pairs and quads from screened stock: plan, reserve, pull by scanning." />
      <PairingTabs />
      <div className="flex flex-col gap-5">
        {canEdit && (
          <Panel title="Request matched sets">
            {stock.isLoading ? (
              <Loading label="Loading stock…" />
            ) : stock.isError ? (
              <Notice tone="fail" title="Stock could not be loaded">
                {(stock.error as Error).message}
              </Notice>
            ) : (
              <KitRequestForm stock={stock.data ?? []} onReserved={(kit) => navigate(pairingPaths.kit(kit.id))} />
            )}
          </Panel>
        )}
        <section aria-labelledby="kits-heading">
          <h2 id="kits-heading" className="mb-2 text-base font-bold text-ink">
            Kits
          </h2>
          <KitsTable kitHref={pairingPaths.kit} />
        </section>
        <p className="text-xs text-ink-faint">Handle parts at an ESD-protected workstation and keep kits in ESD-safe bags (ANSI/ESD S20.20); follow your site's procedures.</p>
      </div>
    </RequireArea>
  );
}
