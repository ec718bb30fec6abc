import { PageHeader, Panel } from '../../../components/ui/page.tsx';
import { LoosePartsForm } from '../../../features/loose-pairing/components/loose-parts-form.tsx';
import { RequireArea } from '../require-area.tsx';
import { PairingTabs } from './pairing-tabs.tsx';

/** /pairing/loose-parts — matched sets among parts measured by hand; nothing is stored. */
export function LoosePartsPage() {
  return (
    <RequireArea area="pairing">
      <PageHeader title="Pairing" subtitle="Loose parts: type the readings of parts measured by hand and see the best matched sets among them." />
      <PairingTabs />
      <Panel title="Hand-measured parts">
        <LoosePartsForm />
      </Panel>
    </RequireArea>
  );
}
