import { APPROVAL_LABELS, type ApprovalStatus } from '../../../../shared/api/catalog.ts';
import { StatusTag } from '../../../components/ui/notice.tsx';

const TONES = { approved: 'pass', conditional: 'hold', 'not-approved': 'fail' } as const;

export function ApprovalTag({ approval }: { approval: ApprovalStatus }) {
  return <StatusTag tone={TONES[approval]}>{APPROVAL_LABELS[approval]}</StatusTag>;
}
