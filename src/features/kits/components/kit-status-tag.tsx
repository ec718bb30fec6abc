import type { KitStatus } from '../../../../shared/api/pairing.ts';
import { StatusTag } from '../../../components/ui/notice.tsx';
import { KIT_STATUS_TONE, kitStatusLabel } from './format.ts';

export function KitStatusTag({ status }: { status: KitStatus }) {
  return <StatusTag tone={KIT_STATUS_TONE[status]}>{kitStatusLabel(status)}</StatusTag>;
}
