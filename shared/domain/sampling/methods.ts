import { AQL_VALUES } from './master-tables.ts';
import { S_METHOD_K_AQLS } from './s-method.ts';

/**
 * How a lot is sampled: 'attribute' — single sampling by ISO 2859-1 (ANSI/ASQ Z1.4);
 * 'zero-acceptance' — c = 0 plans (Squeglia), same lot sizes and AQL columns;
 * 'variables' — ISO 3951-1 / ANSI/ASQ Z1.9 s-method on measured hFE (reference.md §1–2).
 */
export const SAMPLING_METHODS = ['attribute', 'zero-acceptance', 'variables'] as const;
export type SamplingMethod = (typeof SAMPLING_METHODS)[number];

export const SAMPLING_METHOD_LABELS: Readonly<Record<SamplingMethod, string>> = {
  attribute: 'Attribute (ISO 2859-1)',
  'zero-acceptance': 'Zero acceptance (c = 0)',
  variables: 'Variables on hFE (s-method)',
};

export function isSamplingMethod(value: unknown): value is SamplingMethod {
  return typeof value === 'string' && (SAMPLING_METHODS as readonly string[]).includes(value);
}

/**
 * The AQL values (% nonconforming) a method can use: the ISO 2859-1 master-table columns for
 * attribute and zero-acceptance plans (Squeglia indexes c = 0 plans by the same AQLs,
 * reference.md §1.7), and only the columns whose s-method constant k is stored
 * (S_METHOD_K_AQLS, reference.md §2) for variables sampling.
 */
export function aqlsForMethod(method: SamplingMethod): readonly number[] {
  return method === 'variables' ? S_METHOD_K_AQLS : AQL_VALUES;
}
