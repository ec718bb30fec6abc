import { Notice } from '../../../components/ui/notice.tsx';
import { Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { useBiasSources } from '../../../features/fit-for-use/api/get-bias-sources.ts';
import { FitForUsePanel } from '../../../features/fit-for-use/components/fit-for-use-panel.tsx';
import { RequireArea } from '../require-area.tsx';
import { PairingTabs } from './pairing-tabs.tsx';

/** /pairing/fit-for-use — a divider-biased stage run against a lot's or part type's measured parts. */
export function FitForUsePage() {
  const sources = useBiasSources();
  return (
    <RequireArea area="pairing">
      <PageHeader title="Pairing" subtitle="Fit-for-use: how a divider-biased stage behaves across the measured gain and Vbe of a lot or part type." />
      <PairingTabs />
      <Panel title="Stage">
        {sources.isLoading ? (
          <Loading label="Loading measured part types…" />
        ) : sources.isError ? (
          <Notice tone="fail" title="Part types could not be loaded">
            {(sources.error as Error).message}
          </Notice>
        ) : (
          <FitForUsePanel sources={sources.data ?? []} />
        )}
      </Panel>
    </RequireArea>
  );
}
