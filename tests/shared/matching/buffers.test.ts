import { describe, expect, it } from 'vitest';
import { scratchFloat64, scratchInt32 } from '../../../shared/domain/matching/buffers.ts';
import { matchSets, type MatchOptions, type MatchPart } from '../../../shared/domain/matching/index.ts';

describe('scratch buffers', () => {
  it('hands out the same memory for the same key while it is large enough, and a larger buffer when it is not', () => {
    const a = scratchInt32('test.a', 100);
    const b = scratchInt32('test.a', 80);
    expect(b.buffer).toBe(a.buffer);
    expect(b).toHaveLength(80);
    const c = scratchInt32('test.a', 10_000);
    expect(c.buffer).not.toBe(a.buffer);
    expect(c).toHaveLength(10_000);
    // Another key never shares memory.
    expect(scratchInt32('test.b', 50).buffer).not.toBe(c.buffer);
  });

  it('does not keep a buffer above 16 MB', () => {
    const big = scratchFloat64('test.big', 3_000_000); // 24 MB
    expect(scratchFloat64('test.big', 10).buffer).not.toBe(big.buffer);
  });

  it('a small matching after a large one gives the same answer as on its own (no stale contents)', () => {
    const o: MatchOptions = { hfeTolerancePct: 5, vbeToleranceMv: 2, setSize: 2, mode: 'same' };
    const small: MatchPart[] = [
      { id: 'a', polarity: 'NPN', hfe: 200, vbeMv: 650 },
      { id: 'b', polarity: 'NPN', hfe: 204, vbeMv: 651 },
      { id: 'c', polarity: 'NPN', hfe: 198, vbeMv: 650.5 },
      { id: 'd', polarity: 'NPN', hfe: 300, vbeMv: 640 },
      { id: 'e', polarity: 'NPN', hfe: 301, vbeMv: 640.4 },
    ];
    const first = matchSets(small, o);
    const large: MatchPart[] = Array.from({ length: 3000 }, (_, i) => ({ id: `L${i}`, polarity: 'NPN', hfe: 150 + ((i * 7919) % 1000) / 10, vbeMv: 645 + ((i * 104729) % 100) / 10 }));
    matchSets(large, o);
    expect(matchSets(small, o)).toEqual(first);
  });
});
