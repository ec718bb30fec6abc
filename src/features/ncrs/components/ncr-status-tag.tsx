import { NCR_STATUS_LABELS, type NcrStatus } from '../../../../shared/api/supplier-quality.ts';
import { StatusTag } from '../../../components/ui/notice.tsx';

const TONE: Record<NcrStatus, 'hold' | 'info' | 'pass' | 'neutral'> = { open: 'hold', sent: 'info', answered: 'pass', closed: 'neutral' };

export function NcrStatusTag({ status }: { status: NcrStatus }) {
  return <StatusTag tone={TONE[status]}>{NCR_STATUS_LABELS[status]}</StatusTag>;
}
