import type { ContainerStatus } from '../../../../shared/api/bins.ts';
import { StatusTag } from '../../../components/ui/notice.tsx';
import { STATUS_TONE, statusLabel } from './format.ts';

export function ContainerStatusTag({ status }: { status: ContainerStatus }) {
  return <StatusTag tone={STATUS_TONE[status]}>{statusLabel(status)}</StatusTag>;
}
