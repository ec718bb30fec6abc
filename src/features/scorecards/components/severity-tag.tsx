import type { SwitchingSeverityName } from '../../../../shared/api/sampling.ts';
import { StatusTag } from '../../../components/ui/notice.tsx';
import { SEVERITY_LABEL, SEVERITY_TONE } from './format.ts';

export function SeverityTag({ severity }: { severity: SwitchingSeverityName }) {
  return <StatusTag tone={SEVERITY_TONE[severity]}>{SEVERITY_LABEL[severity]}</StatusTag>;
}
