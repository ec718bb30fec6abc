import reference from 'edmonds-blossom-fixed';
import { matchSets, hfeWithinTolerance, vbeWithinTolerance, setMismatch, hfeSpreadPct } from '../shared/domain/matching/index.ts';
function rng(seed: number) { let a = seed >>> 0; return () => { a = (a + 0x6d2b79f5) >>> 0; let t = a; t = Math.imul(t ^ (t >>> 15), t | 1); t ^= t + Math.imul(t ^ (t >>> 7), t | 61); return ((t ^ (t >>> 14)) >>> 0) / 4294967296; }; }
const r = rng(1);
const g = () => Math.sqrt(-2 * Math.log(1 - r())) * Math.cos(2 * Math.PI * r());
for (const n of [1000, 2000, 4000, 10000]) {
  const parts = Array.from({ length: n }, (_, i) => ({ id: i, polarity: 'NPN' as const, hfe: Math.round((200 + 30 * g()) * 10) / 10, vbeMv: Math.round((650 + 5 * g()) * 10) / 10 }));
  const o = { hfeTolerancePct: 5, vbeToleranceMv: 2, setSize: 2 as const, mode: 'same' as const };
  let t0 = performance.now();
  const res = matchSets(parts, o);
  const ms = performance.now() - t0;
  // build graph
  t0 = performance.now();
  const sorted = parts.map((_, i) => i).sort((a, b) => parts[a].hfe - parts[b].hfe);
  const edges: number[][] = [];
  const S = 2 ** 20;
  for (let x = 0; x < n; x++) for (let y = x + 1; y < n; y++) {
    const a = parts[sorted[x]], b = parts[sorted[y]];
    if (!hfeWithinTolerance(a.hfe, b.hfe, 5)) break;
    if (!vbeWithinTolerance(a.vbeMv, b.vbeMv, 2)) continue;
    const m = setMismatch(hfeSpreadPct(Math.min(a.hfe,b.hfe), Math.max(a.hfe,b.hfe)), Math.abs(a.vbeMv - b.vbeMv), 5, 2);
    edges.push([sorted[x], sorted[y], 2 * S + 1 - Math.round(m * S)]);
  }
  const build = performance.now() - t0;
  console.log(n, 'ours', ms.toFixed(0), 'sets', res.sets.length, 'edges', edges.length, 'build', build.toFixed(0));
  if (n <= 4000) {
    t0 = performance.now();
    const mate = reference(edges, true);
    const refMs = performance.now() - t0;
    console.log('  ref', refMs.toFixed(0), 'sets', mate.filter((m, v) => m > v).length);
  }
}
