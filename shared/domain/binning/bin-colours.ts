/**
 * Binwright's own palette for gain bins, used on screen and on bin labels. A colour is only ever
 * a second signal: wherever it appears, the bin code and its text appear with it. Colours are
 * given by the bin's position in its scheme (0 = lowest hFE); `text` is the ink for text drawn
 * on the colour, chosen for a contrast ratio of at least 4.5 : 1 (WCAG 2.x, relative luminance).
 */
export interface BinColour {
  /** Fill, #rrggbb. */
  fill: string;
  /** Ink for text on the fill, #rrggbb. */
  text: string;
  /** A plain name, for screen readers and printed legends. */
  name: string;
}

const PALETTE: readonly BinColour[] = [
  { fill: '#1d5fa8', text: '#ffffff', name: 'blue' },
  { fill: '#2e7d3a', text: '#ffffff', name: 'green' },
  { fill: '#e3b505', text: '#1f2a33', name: 'yellow' },
  { fill: '#b8420f', text: '#ffffff', name: 'rust' },
  { fill: '#6d3fc0', text: '#ffffff', name: 'violet' },
  { fill: '#0f7483', text: '#ffffff', name: 'teal' },
  { fill: '#b01f5c', text: '#ffffff', name: 'magenta' },
  { fill: '#6b4f2a', text: '#ffffff', name: 'brown' },
];

/** The colour of "outside all bins": a neutral grey, always shown with the words. */
export const OUTSIDE_BIN_COLOUR: BinColour = { fill: '#5f6b73', text: '#ffffff', name: 'grey' };

/** Number of distinct colours before the palette repeats. */
export const BIN_PALETTE_SIZE = PALETTE.length;

/**
 * The colour of the bin at `index` in its scheme (0-based); the palette repeats after
 * BIN_PALETTE_SIZE bins, which is why the code always goes with it. A null or negative index
 * means "outside all bins".
 */
export function binColour(index: number | null): BinColour {
  if (index === null || !Number.isInteger(index) || index < 0) return OUTSIDE_BIN_COLOUR;
  return PALETTE[index % PALETTE.length] as BinColour;
}

/** WCAG 2.x relative luminance of an #rrggbb colour. */
export function relativeLuminance(hex: string): number {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!m) throw new Error(`not an #rrggbb colour: ${hex}`);
  const [r, g, b] = [m[1], m[2], m[3]].map((h) => {
    const c = parseInt(h as string, 16) / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  }) as [number, number, number];
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** WCAG 2.x contrast ratio of two #rrggbb colours, 1 to 21. */
export function contrastRatio(a: string, b: string): number {
  const la = relativeLuminance(a);
  const lb = relativeLuminance(b);
  return (Math.max(la, lb) + 0.05) / (Math.min(la, lb) + 0.05);
}
