import { describe, expect, it } from 'vitest';
import { adjustQuantity, statusAfter } from '../../../shared/domain/screening/index.ts';

// Product rule (Binwright Bins): counts never go negative, nor above the container's capacity.
describe('adjustQuantity', () => {
  const cases = [
    { q: 10, cap: 50, delta: -1, out: { ok: true, quantity: 9 } },
    { q: 1, cap: 50, delta: -1, out: { ok: true, quantity: 0 } },
    { q: 0, cap: 50, delta: -1, out: { ok: false, reason: 'below-zero' } },
    { q: 3, cap: 50, delta: -4, out: { ok: false, reason: 'below-zero' } },
    { q: 49, cap: 50, delta: 1, out: { ok: true, quantity: 50 } },
    { q: 50, cap: 50, delta: 1, out: { ok: false, reason: 'over-capacity' } },
    { q: 5, cap: 50, delta: 0, out: { ok: false, reason: 'zero' } },
    { q: 5, cap: 50, delta: 0.5, out: { ok: false, reason: 'not-whole' } },
  ];
  it.each(cases)('$q of $cap with delta $delta → $out.reason $out.quantity', ({ q, cap, delta, out }) => {
    expect(adjustQuantity({ quantity: q, capacity: cap }, delta)).toMatchObject(out);
  });
});

describe('statusAfter', () => {
  const cases = [
    { prev: 'open', q: 50, cap: 50, next: 'full', why: 'reaching the capacity fills it' },
    { prev: 'open', q: 0, cap: 50, next: 'open', why: 'an open container stays open at zero (screening refills it)' },
    { prev: 'closed', q: 0, cap: 50, next: 'empty', why: 'a closed container left without parts is empty' },
    { prev: 'full', q: 0, cap: 50, next: 'empty', why: 'a full container left without parts is empty' },
    { prev: 'full', q: 49, cap: 50, next: 'full', why: 'a full container that loses a part is not refilled by screening' },
    { prev: 'empty', q: 3, cap: 50, next: 'closed', why: 'parts put back into an empty container make it closed' },
    { prev: 'closed', q: 7, cap: 50, next: 'closed', why: 'otherwise nothing changes' },
  ] as const;
  it.each(cases)('$prev → $next when $why', ({ prev, q, cap, next }) => {
    expect(statusAfter(prev, q, cap)).toBe(next);
  });
});
