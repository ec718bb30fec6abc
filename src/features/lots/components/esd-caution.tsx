import type { LotDetail } from '../../../../shared/api/lots.ts';
import { ESD_CAUTION_TEXT } from '../../../../shared/domain/esd/index.ts';
import { Notice } from '../../../components/ui/notice.tsx';

/** ESD caution with the part's HBM class (ANSI/ESDA/JEDEC JS-001), deferring to the site's procedures. */
export function EsdCaution({ lot }: { lot: LotDetail }) {
  const title = lot.esd ? `ESD sensitive — HBM class ${lot.esd.hbmClass} (${lot.esd.range})` : 'ESD sensitive — HBM class not stated';
  return (
    <Notice tone="hold" title={title}>
      {ESD_CAUTION_TEXT}
    </Notice>
  );
}
