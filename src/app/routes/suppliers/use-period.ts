import { useSearchParams } from 'react-router-dom';
import type { ScorecardPeriod } from '../../../../shared/api/supplier-quality.ts';
import { defaultPeriod } from '../../../features/scorecards/components/format.ts';

/** The scorecard period kept in the address (?from=&to=), so a view can be shared; default the last year. */
export function usePeriod(): [ScorecardPeriod, (p: ScorecardPeriod) => void] {
  const [params, setParams] = useSearchParams();
  const d = defaultPeriod();
  const period = { from: params.get('from') ?? d.from, to: params.get('to') ?? d.to };
  return [period, (p) => setParams({ from: p.from, to: p.to }, { replace: true })];
}
