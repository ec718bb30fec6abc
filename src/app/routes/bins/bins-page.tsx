import { useNavigate } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice.tsx';
import { EmptyState, Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { useStock } from '../../../features/bins/api/get-stock.ts';
import { ContainersTable } from '../../../features/bins/components/containers-table.tsx';
import { ScanContainerField } from '../../../features/bins/components/scan-container-field.tsx';
import { StockChart } from '../../../features/bins/components/stock-chart.tsx';
import { RequireArea } from '../require-area.tsx';
import { useSessionUser } from '../use-session-user.ts';

export const containerHref = (id: number) => `/bins/containers/${id}`;

/** /bins — scan a container, stock per bin for each part type, and the containers table. */
export function BinsPage() {
  const user = useSessionUser();
  const navigate = useNavigate();
  const stock = useStock();
  const canEdit = user.role === 'inspector' || user.role === 'quality';
  const parts = stock.data?.partTypes ?? [];
  return (
    <RequireArea area="bins">
      <PageHeader title="Bins" subtitle="Stock per gain bin, containers with their positions, and bin labels. Colours always come with the bin's code." />
      <div className="flex flex-col gap-5">
        <Panel>
          <ScanContainerField onFound={(c) => navigate(containerHref(c.id))} />
        </Panel>
        <section aria-labelledby="stock-heading">
          <h2 id="stock-heading" className="mb-2 text-base font-bold text-ink">
            Stock per bin
          </h2>
          {stock.isLoading ? (
            <Loading label="Loading stock…" />
          ) : stock.isError ? (
            <Notice tone="fail" title="Stock could not be loaded">
              {(stock.error as Error).message}
            </Notice>
          ) : parts.length === 0 ? (
            <EmptyState title="Nothing in stock yet">Containers appear here when a lot is screened into gain bins at the bench.</EmptyState>
          ) : (
            <div className="grid gap-4 lg:grid-cols-2">
              {parts.map((p) => (
                <Panel key={p.partTypeId} title={`${p.partNumber} — ${p.quantity.toLocaleString()} parts`}>
                  <StockChart part={p} />
                </Panel>
              ))}
            </div>
          )}
        </section>
        <section aria-labelledby="containers-heading">
          <h2 id="containers-heading" className="mb-2 text-base font-bold text-ink">
            Containers
          </h2>
          <ContainersTable canEdit={canEdit} containerHref={containerHref} partTypes={parts.map((p) => ({ id: p.partTypeId, partNumber: p.partNumber }))} />
        </section>
        <p className="text-xs text-ink-faint">Handle parts at an ESD-protected workstation and keep them in ESD-safe containers (ANSI/ESD S20.20); follow your site's procedures.</p>
      </div>
    </RequireArea>
  );
}
