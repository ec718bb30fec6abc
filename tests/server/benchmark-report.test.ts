import { describe, expect, it } from 'vitest';
import { routeChunks, routePathsFromRouter, type BundleFile, type ManifestChunk } from '../../scripts/bench-bundle.ts';
import {
  BENCH_END_MARKER,
  BENCH_START_MARKER,
  markdownTable,
  median,
  replaceBenchSection,
  reportMarkdown,
  reportText,
  type BenchReport,
} from '../../scripts/lib/bench-report.ts';

// Pure parts of `npm run bench` (scripts/lib/bench-report.ts, scripts/bench-bundle.ts): no
// database, no timing — what goes into docs/benchmarks.md and how it replaces the old figures.

const HAND_WRITTEN = ['# Benchmarks', '', 'Method, written by hand.', '', '## Figures', '', BENCH_START_MARKER, 'old figures', '| a | b |', BENCH_END_MARKER, '', '## Not done', '', '- kept'].join('\n');

describe('replaceBenchSection', () => {
  it('replaces only the text between the markers and keeps every hand-written line around them', () => {
    const out = replaceBenchSection(HAND_WRITTEN, 'new table\n');
    expect(out).toBe(HAND_WRITTEN.replace('old figures\n| a | b |', 'new table'));
    expect(out).toContain('Method, written by hand.');
    expect(out).toContain('## Not done\n\n- kept');
    expect(out).not.toContain('old figures');
  });

  it('a rerun replaces the previous run, so the file does not grow', () => {
    const once = replaceBenchSection(HAND_WRITTEN, 'run 1');
    const twice = replaceBenchSection(once, 'run 2');
    expect(twice).toBe(HAND_WRITTEN.replace('old figures\n| a | b |', 'run 2'));
    expect(twice.split(BENCH_START_MARKER)).toHaveLength(2);
  });

  it('a document without markers gets the section appended at the end', () => {
    expect(replaceBenchSection('# Benchmarks\n\ntext\n\n', 'table')).toBe(`# Benchmarks\n\ntext\n\n${BENCH_START_MARKER}\ntable\n${BENCH_END_MARKER}\n`);
  });

  it.each([
    ['only a start marker', `a\n${BENCH_START_MARKER}\nb`],
    ['only an end marker', `a\n${BENCH_END_MARKER}\nb`],
    ['two start markers', `${BENCH_START_MARKER}\n${BENCH_START_MARKER}\n${BENCH_END_MARKER}`],
    ['the end before the start', `${BENCH_END_MARKER}\nx\n${BENCH_START_MARKER}`],
  ])('with %s, refuses instead of overwriting hand-written text', (_why, doc) => {
    expect(() => replaceBenchSection(doc, 'table')).toThrow(/benchmarks\.md/);
  });
});

const REPORT: BenchReport = {
  machine: {
    cpuModel: 'Example CPU',
    cpuCount: 2,
    totalMemoryBytes: 8 * 1024 ** 3,
    nodeVersion: '20.20.2',
    postgresVersion: '15.18',
    loadStart: [0.5, 1, 1.25],
    loadEnd: [2, 1.5, 1.25],
    startedAt: '2026-12-01T10:00:00.000Z',
    durationSeconds: 95.4,
  },
  rows: [
    { measure: 'import', result: '**73 500 rows/s**', target: '≥ 50 000 rows/s', met: true },
    { measure: 'over HTTP', result: 'a | b', target: '', met: null, detail: true },
    { measure: 'summary', result: '170 ms', target: '< 150 ms', met: false },
  ],
  tables: [{ title: 'Routes', columns: ['route', 'gzip'], rows: [['`/dock`', '23.0 kB']] }],
  notes: ['medians of 3 runs'],
};

describe('the report', () => {
  it('in Markdown: the machine header, one row per measure with met / MISSED / —, pipes escaped, extra tables and notes', () => {
    const md = reportMarkdown(REPORT);
    expect(md).toContain('- CPU: Example CPU × 2; memory 8.0 GiB');
    expect(md).toContain('- Node 20.20.2; PostgreSQL 15.18');
    expect(md).toContain('- Load average (1 / 5 / 15 min): 0.50 / 1.00 / 1.25 at the start, 2.00 / 1.50 / 1.25 at the end (2 CPUs)');
    expect(md).toContain('- Date: 2026-12-01 10:00 UTC (the run took 95 s)');
    expect(md).toContain('| measure | result | target | met? |');
    expect(md).toContain('| import | **73 500 rows/s** | ≥ 50 000 rows/s | met |');
    expect(md).toContain('| ↳ over HTTP | a \\| b | — | — |');
    expect(md).toContain('| summary | 170 ms | < 150 ms | MISSED |');
    expect(md).toContain('**Routes**\n\n| route | gzip |\n|---|---|\n| `/dock` | 23.0 kB |');
    expect(md).toContain('- medians of 3 runs');
    expect(md).not.toContain(BENCH_START_MARKER);
  });

  it('as text: the same rows without Markdown marks, columns aligned', () => {
    const text = reportText(REPORT);
    expect(text).toContain('73 500 rows/s');
    expect(text).not.toContain('**');
    expect(text).not.toContain('`');
    const lines = text.split('\n');
    const header = lines.find((l) => l.includes('measure') && l.includes('met?')) as string;
    const summary = lines.find((l) => l.trimStart().startsWith('summary')) as string;
    expect(summary.indexOf('170 ms')).toBe(header.indexOf('result'));
    expect(summary.endsWith('MISSED')).toBe(true);
  });

  it('markdownTable pads missing cells and flattens line breaks', () => {
    expect(markdownTable(['a', 'b'], [['x\ny']])).toEqual(['| a | b |', '|---|---|', '| x y |  |']);
  });

  it('median of odd and even counts', () => {
    expect(median([3, 1, 2])).toBe(2);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([])).toBeNaN();
  });
});

describe('per-route client chunks', () => {
  const ROUTER = `
    { path: 'dock', lazy: page(() => import('./routes/dock/dock.tsx'), 'DockPage') },
    { path: 'dock/lots/:id', lazy: page(() => import('./routes/dock/lot.tsx'), 'LotPage') },
  `;

  it('reads the URL path of each lazy route module from the router', () => {
    expect([...routePathsFromRouter(ROUTER)]).toEqual([
      ['src/app/routes/dock/dock.tsx', '/dock'],
      ['src/app/routes/dock/lot.tsx', '/dock/lots/:id'],
    ]);
  });

  it('a route adds its own chunk and the shared chunks it imports that the first load did not bring, counted once', () => {
    const manifest: Record<string, ManifestChunk> = {
      'index.html': { file: 'assets/index.js', isEntry: true, imports: ['_react.js'] },
      '_react.js': { file: 'assets/react.js' },
      '_table.js': { file: 'assets/table.js', imports: ['_react.js', '_format.js'] },
      '_format.js': { file: 'assets/format.js', imports: ['_table.js'] },
      'src/app/routes/dock/dock.tsx': { file: 'assets/dock.js', isDynamicEntry: true, imports: ['_table.js', '_react.js'] },
      'src/app/routes/dock/lot.tsx': { file: 'assets/lot.js', isDynamicEntry: true, imports: ['_react.js'] },
      'src/lib/chart.tsx': { file: 'assets/chart.js', isDynamicEntry: true },
    };
    const sizes: Record<string, number> = { 'assets/dock.js': 300, 'assets/table.js': 200, 'assets/format.js': 50, 'assets/lot.js': 100 };
    const measure = (file: string): BundleFile => ({ file, bytes: (sizes[file] ?? 0) * 3, gzipBytes: sizes[file] ?? 0 });
    const routes = routeChunks(manifest, new Set(['assets/index.js', 'assets/react.js']), routePathsFromRouter(ROUTER), measure);
    expect(routes.map((r) => [r.route, r.files.map((f) => f.file).sort(), r.gzipBytes, r.bytes])).toEqual([
      ['/dock', ['assets/dock.js', 'assets/format.js', 'assets/table.js'], 550, 1650],
      ['/dock/lots/:id', ['assets/lot.js'], 100, 300],
    ]);
  });
});
