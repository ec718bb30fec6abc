import type { HistogramRuleParam } from '../../../../shared/api/lot-results.ts';

export const lotResultKeys = {
  all: ['lot-results'] as const,
  lot: (lotId: number) => [...lotResultKeys.all, lotId] as const,
  summary: (lotId: number, rule: HistogramRuleParam) => [...lotResultKeys.lot(lotId), 'summary', rule] as const,
};
