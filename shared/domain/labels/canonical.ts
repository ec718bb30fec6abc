import { FORMAT_06, GS, type LabelElement } from './iso-15434.ts';

/**
 * The canonical text of a parsed format-06 label: "06", then each data element as DI + value,
 * all joined by GS. Two scans of the same label give the same text whatever separator
 * substitutes the scanner typed, whether the trailer was dropped, and however the values were
 * padded, so its hash identifies the label (the server stores SHA-256 of it). Element order is
 * kept: it is part of the printed label.
 * @throws Error when there are no elements (nothing identifies the label).
 */
export function canonicalLabelText(elements: readonly LabelElement[]): string {
  if (elements.length === 0) throw new Error('a label without data elements has no canonical text');
  return [FORMAT_06, ...elements.map((e) => `${e.di}${e.value.trim()}`)].join(GS);
}
