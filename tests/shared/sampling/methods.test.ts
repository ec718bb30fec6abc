import { describe, expect, it } from 'vitest';
import { AQL_VALUES, S_METHOD_K_AQLS, SAMPLING_METHODS, aqlsForMethod, isSamplingMethod } from '../../../shared/domain/sampling/index.ts';

describe('sampling methods', () => {
  it('lists attribute, zero-acceptance and variables', () => {
    expect(SAMPLING_METHODS).toEqual(['attribute', 'zero-acceptance', 'variables']);
  });

  it.each([
    ['attribute', true],
    ['variables', true],
    ['double', false],
    [3, false],
  ])('isSamplingMethod(%j) is %s', (value, expected) => {
    expect(isSamplingMethod(value)).toBe(expected);
  });

  it('attribute and zero-acceptance use every ISO 2859-1 master-table AQL column (reference.md §1.3, §1.7)', () => {
    expect(aqlsForMethod('attribute')).toEqual(AQL_VALUES);
    expect(aqlsForMethod('zero-acceptance')).toEqual(AQL_VALUES);
    expect(aqlsForMethod('attribute')).toContain(0.065);
  });

  it('variables sampling offers only the AQLs whose s-method k is stored (Z1.9 Table B-1, reference.md §2)', () => {
    expect(aqlsForMethod('variables')).toEqual(S_METHOD_K_AQLS);
    expect(aqlsForMethod('variables')).not.toContain(0.065);
  });
});
