import { describe, expect, it } from 'vitest';
import { EOT, GS, RS, canonicalLabelText, parseLabel } from '../../../shared/domain/labels/index.ts';

// Envelope and separators: ISO/IEC 15434 (reference.md §3); DIs 1P, Q, 1T: ANSI MH10.8.2. Values invented.
const ELEMENTS = ['1PBW-TX-01', 'Q500', '1TLOT77'];

describe('canonicalLabelText', () => {
  it('when the same label arrives with real separators, with <GS>-style substitutes, or without trailer, gives one text', () => {
    const real = parseLabel(`[)>${RS}06${GS}${ELEMENTS.join(GS)}${RS}${EOT}`);
    const typed = parseLabel(`[)><RS>06<GS>${ELEMENTS.join('<GS>')}<RS><EOT>\n`);
    const noTrailer = parseLabel(`[)>${RS}06${GS}${ELEMENTS.join(` ${GS}`)}`);
    const texts = [real, typed, noTrailer].map((p) => canonicalLabelText(p.elements));
    expect(new Set(texts).size).toBe(1);
    expect(texts[0]).toBe(`06${GS}1PBW-TX-01${GS}Q500${GS}1TLOT77`);
  });

  it('when one value differs, gives a different text', () => {
    const a = canonicalLabelText(parseLabel(`[)>${RS}06${GS}${ELEMENTS.join(GS)}${RS}${EOT}`).elements);
    const b = canonicalLabelText(parseLabel(`[)>${RS}06${GS}1PBW-TX-01${GS}Q501${GS}1TLOT77${RS}${EOT}`).elements);
    expect(a).not.toBe(b);
  });

  it('when there are no elements, throws', () => {
    expect(() => canonicalLabelText([])).toThrow(/no canonical text/);
  });
});
