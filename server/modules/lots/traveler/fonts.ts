import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';

const require = createRequire(import.meta.url);

export interface FontFiles {
  regular: Buffer;
  bold: Buffer;
  source: string;
}

let cached: FontFiles | null = null;

function packageDir(name: string): string | null {
  try {
    return path.dirname(require.resolve(`${name}/package.json`));
  } catch {
    return null;
  }
}

/**
 * Source Sans 3 for the PDFs: the complete TTFs of the `source-sans` package (OFL) when present,
 * which carry ≤, °, × and the dashes; otherwise the latin WOFF subsets of @fontsource (pdfkit
 * cannot read .woff2).
 */
export function sourceSans(): FontFiles {
  if (cached) return cached;
  const full = packageDir('source-sans');
  if (full && fs.existsSync(path.join(full, 'TTF', 'SourceSans3-Regular.ttf'))) {
    cached = {
      regular: fs.readFileSync(path.join(full, 'TTF', 'SourceSans3-Regular.ttf')),
      bold: fs.readFileSync(path.join(full, 'TTF', 'SourceSans3-Bold.ttf')),
      source: 'source-sans TTF',
    };
    return cached;
  }
  const subset = packageDir('@fontsource/source-sans-3');
  if (!subset) throw new Error('Source Sans 3 is not installed (source-sans or @fontsource/source-sans-3)');
  cached = {
    regular: fs.readFileSync(path.join(subset, 'files', 'source-sans-3-latin-400-normal.woff')),
    bold: fs.readFileSync(path.join(subset, 'files', 'source-sans-3-latin-700-normal.woff')),
    source: '@fontsource latin WOFF',
  };
  return cached;
}
