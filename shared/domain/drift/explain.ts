import type { DriftFigures, DriftFlag } from './compare.ts';

/**
 * Inspections to consider for a lot whose gain distribution stands out, after SAE AS6081
 * (documentation and packaging check, external visual inspection, marking permanency, electrical
 * test on a sample), IDEA-STD-1010 (visual acceptability: package, marking, leads, consistency of
 * date and lot codes and labels) and SAE AS5553 (authorised sources, quarantine and reporting of
 * suspect parts) — reference.md §8.
 */
export const SUGGESTED_CHECKS: readonly string[] = [
  'Compare the date and lot codes on the parts, reels or bags with the supplier label and the certificate of conformance; more than one date code in one delivery is a common cause (IDEA-STD-1010 consistency check).',
  'External visual inspection of a sample under magnification: package, marking, leads, signs of resurfacing or re-marking (SAE AS6081, IDEA-STD-1010).',
  'Marking-permanency test on a few parts from each gain group (SAE AS6081).',
  'Re-measure a few parts from each group to rule out a measurement or fixture error.',
  'Ask the supplier for traceability to the original manufacturer and the manufacturer\u2019s lot (SAE AS5553).',
  'Keep the lot in quarantine until the checks are done, and report suspect parts as your procedures require.',
];

/**
 * Turns the figures and flags into a few plain sentences: what stands out, the usual causes, and
 * that nothing here shows the parts are counterfeit.
 */
export function explainDrift(figures: DriftFigures, flags: DriftFlag[], notes: string[]): { explanation: string; suggestedChecks: string[] } {
  const base = figures.historyN
    ? `${figures.n} readings compared with ${figures.historyN} accepted readings${figures.historyLots ? ` from ${figures.historyLots} earlier lot${figures.historyLots === 1 ? '' : 's'}` : ''} of this supplier and part.`
    : `${figures.n} readings; this supplier has no accepted history for the part yet.`;
  if (flags.length === 0) {
    return {
      explanation: [`No check exceeded its threshold: the lot's gain distribution is in line with the history. ${base}`, ...notes].join(' '),
      suggestedChecks: [],
    };
  }
  const causes: string[] = [];
  const has = (c: DriftFlag['check']) => flags.some((f) => f.check === c);
  if (has('bimodal')) causes.push('two or more populations in one lot — typically mixed date codes or wafer lots, or parts from different sources packed together');
  if (has('median') || has('ks')) causes.push('a shift from the usual production — a new die revision, another fab or date code, or stock that is not what the label says');
  if (has('outside')) causes.push('parts outside the gain group ordered — a wrong gain group, mixed stock, or re-marked parts');
  const sentences = [
    `This lot's gain distribution stands out from the supplier's accepted history. ${base}`,
    ...flags.map((f) => f.message),
    `Common causes: ${causes.join('; ')}. Mixed date codes and counterfeit or re-marked stock are both known to show up like this, but these figures alone do not show which — they are a reason to look closer, not a finding.`,
    ...notes,
  ];
  return { explanation: sentences.join(' '), suggestedChecks: [...SUGGESTED_CHECKS] };
}
