/**
 * Client size figure for `npm run bench`: the JavaScript a browser downloads on the first load
 * (the entry chunk and every chunk it imports statically, i.e. the `<script type="module">` and
 * `<link rel="modulepreload">` of index.html, or the entry's static `imports` in Vite's
 * manifest when the build writes one), raw and gzip-compressed (zlib level 9, as a server
 * would serve it pre-compressed), beside the chunks loaded later (dynamic imports) and the CSS.
 * Per route (with Vite's manifest, which `--build` asks for): the JavaScript a first visit to
 * that page adds — its lazy chunk and the shared chunks it imports that the first load did not
 * bring. Target: initial JavaScript under 250 kB gzip. Prints figures only.
 *
 * Standalone: `npx tsx --tsconfig tsconfig.server.json scripts/bench-bundle.ts [--build]`
 * (folder from BINWRIGHT_DIST_DIR, default dist; --build runs `vite build` into it first).
 */
import fs from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import zlib from 'node:zlib';

export interface BundleFile {
  file: string;
  bytes: number;
  gzipBytes: number;
}

export interface BundleReport {
  distDir: string;
  /** How the first-load set was found. */
  source: 'manifest' | 'index.html';
  initial: BundleFile[];
  initialJsBytes: number;
  initialJsGzipBytes: number;
  /** JavaScript chunks not loaded on the first page (route chunks, dynamic imports). */
  later: BundleFile[];
  laterJsGzipBytes: number;
  css: BundleFile[];
  cssGzipBytes: number;
  targetGzipBytes: number;
  /** Per lazy route (manifest builds only; null without a manifest), largest first. */
  routes: RouteChunks[] | null;
}

export interface RouteChunks {
  /** URL path from src/app/router.tsx, or the module when the router does not name it. */
  route: string;
  /** The route's module, e.g. src/app/routes/dock/dock.tsx. */
  module: string;
  /** Files a first visit adds beyond the first load: the route chunk and its not-yet-loaded static imports. */
  files: BundleFile[];
  bytes: number;
  gzipBytes: number;
}

const TARGET_GZIP = 250 * 1000;

function measure(distDir: string, rel: string): BundleFile {
  const bytes = fs.readFileSync(path.join(distDir, rel));
  return { file: rel, bytes: bytes.length, gzipBytes: zlib.gzipSync(bytes, { level: 9 }).length };
}

export interface ManifestChunk {
  file: string;
  isEntry?: boolean;
  isDynamicEntry?: boolean;
  imports?: string[];
  css?: string[];
}

function readManifest(distDir: string): Record<string, ManifestChunk> | null {
  const file = [path.join(distDir, '.vite', 'manifest.json'), path.join(distDir, 'manifest.json')].find((f) => fs.existsSync(f));
  return file ? (JSON.parse(fs.readFileSync(file, 'utf8')) as Record<string, ManifestChunk>) : null;
}

/**
 * URL path of each lazy route module, read from the router's source: entries written
 * `{ path: 'dock/lots/:id', lazy: page(() => import('./routes/dock/lot.tsx'), …) }`.
 * Keys are the modules as the manifest names them (src/app/routes/…).
 */
export function routePathsFromRouter(source: string, routerDir = 'src/app'): Map<string, string> {
  const out = new Map<string, string>();
  for (const m of source.matchAll(/path:\s*'([^']*)'\s*,\s*lazy:\s*\w+\(\s*\(\)\s*=>\s*import\(\s*'\.\/([^']+)'\s*\)/g)) {
    out.set(path.posix.join(routerDir, m[2] as string), `/${m[1] as string}`);
  }
  return out;
}

/**
 * Per lazy route module of the manifest: the chunks a first visit adds — the route's own chunk
 * and its static imports, transitively, minus what the first load already brought (`initial`).
 * Sizes come from `measureFile`. Largest first.
 */
export function routeChunks(
  manifest: Record<string, ManifestChunk>,
  initial: ReadonlySet<string>,
  routePaths: ReadonlyMap<string, string>,
  measureFile: (file: string) => BundleFile,
): RouteChunks[] {
  const out: RouteChunks[] = [];
  for (const [key, chunk] of Object.entries(manifest)) {
    if (!chunk.isDynamicEntry || !key.startsWith('src/app/routes/')) continue;
    const files = new Set<string>();
    const visit = (k: string) => {
      const c = manifest[k];
      if (!c || files.has(c.file) || initial.has(c.file)) return;
      files.add(c.file);
      for (const i of c.imports ?? []) visit(i);
    };
    visit(key);
    const measured = [...files].map(measureFile);
    out.push({
      route: routePaths.get(key) ?? key,
      module: key,
      files: measured,
      bytes: measured.reduce((a, f) => a + f.bytes, 0),
      gzipBytes: measured.reduce((a, f) => a + f.gzipBytes, 0),
    });
  }
  return out.sort((a, b) => b.gzipBytes - a.gzipBytes || a.route.localeCompare(b.route));
}

function fromManifest(distDir: string): { initial: string[]; css: string[] } | null {
  const manifest = readManifest(distDir);
  if (!manifest) return null;
  const initial = new Set<string>();
  const css = new Set<string>();
  const visit = (key: string) => {
    const chunk = manifest[key];
    if (!chunk || initial.has(chunk.file)) return;
    initial.add(chunk.file);
    for (const c of chunk.css ?? []) css.add(c);
    for (const i of chunk.imports ?? []) visit(i);
  };
  for (const [key, chunk] of Object.entries(manifest)) if (chunk.isEntry) visit(key);
  return { initial: [...initial], css: [...css] };
}

function fromIndexHtml(distDir: string): { initial: string[]; css: string[] } {
  const html = fs.readFileSync(path.join(distDir, 'index.html'), 'utf8');
  const attr = (tag: string, name: string) => new RegExp(`${name}="([^"]+)"`).exec(tag)?.[1];
  const rel = (href: string) => href.replace(/^\//, '');
  const initial: string[] = [];
  const css: string[] = [];
  for (const tag of html.match(/<script\b[^>]*>/g) ?? []) {
    const src = attr(tag, 'src');
    if (src && /type="module"/.test(tag)) initial.push(rel(src));
  }
  for (const tag of html.match(/<link\b[^>]*>/g) ?? []) {
    const href = attr(tag, 'href');
    if (!href) continue;
    if (/rel="modulepreload"/.test(tag)) initial.push(rel(href));
    if (/rel="stylesheet"/.test(tag)) css.push(rel(href));
  }
  return { initial, css };
}

/** Static imports (`import … from "./x.js"`, not `import("./x.js")`) of a built chunk, as paths relative to the dist folder. */
function staticImports(distDir: string, rel: string): string[] {
  const code = fs.readFileSync(path.join(distDir, rel), 'utf8');
  const out: string[] = [];
  for (const m of code.matchAll(/(?:^|[;}\n])\s*import\s*(?:[\w$*{}\s,]+from\s*)?["'](\.{1,2}\/[^"']+\.js)["']/g)) {
    out.push(path.posix.normalize(path.posix.join(path.posix.dirname(rel), m[1])));
  }
  return out;
}

/** The first-load set closed over static imports (a build without modulepreload links still loads them). */
function withStaticImports(distDir: string, initial: string[]): string[] {
  const seen = new Set<string>();
  const visit = (rel: string) => {
    if (seen.has(rel) || !fs.existsSync(path.join(distDir, rel))) return;
    seen.add(rel);
    for (const i of staticImports(distDir, rel)) visit(i);
  };
  for (const f of initial) visit(f);
  return [...seen];
}

function listFiles(dir: string, root = dir): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const full = path.join(dir, e.name);
    return e.isDirectory() ? listFiles(full, root) : [path.relative(root, full)];
  });
}

/** Measures a built client folder (index.html + assets). */
export async function benchBundle(opts: { distDir?: string; build?: boolean } = {}): Promise<BundleReport> {
  const distDir = path.resolve(opts.distDir ?? process.env.BINWRIGHT_DIST_DIR ?? 'dist');
  if (opts.build) {
    const { build } = await import('vite');
    // The manifest names each lazy route's chunk, for the per-route figures.
    await build({ logLevel: 'warn', mode: 'production', build: { outDir: distDir, emptyOutDir: true, manifest: true } });
  }
  if (!fs.existsSync(path.join(distDir, 'index.html'))) throw new Error(`No built client in ${distDir}: run vite build (or pass --build).`);
  const fromM = fromManifest(distDir);
  const found = fromM ?? fromIndexHtml(distDir);
  const initial = withStaticImports(distDir, [...new Set(found.initial)]).map((f) => measure(distDir, f));
  const initialSet = new Set(initial.map((f) => f.file));
  const allJs = listFiles(distDir).filter((f) => f.endsWith('.js') && !f.startsWith('.vite'));
  const later = allJs.filter((f) => !initialSet.has(f)).map((f) => measure(distDir, f));
  const cssFiles = found.css.length ? found.css : listFiles(distDir).filter((f) => f.endsWith('.css'));
  const css = [...new Set(cssFiles)].map((f) => measure(distDir, f));
  const sum = (xs: BundleFile[], k: 'bytes' | 'gzipBytes') => xs.reduce((a, x) => a + x[k], 0);
  const manifest = readManifest(distDir);
  const routerFile = path.resolve('src/app/router.tsx');
  const routePaths = fs.existsSync(routerFile) ? routePathsFromRouter(fs.readFileSync(routerFile, 'utf8')) : new Map<string, string>();
  const measured = new Map([...initial, ...later].map((f) => [f.file, f]));
  const routes = manifest ? routeChunks(manifest, initialSet, routePaths, (f) => measured.get(f) ?? measure(distDir, f)) : null;
  return {
    distDir,
    source: fromM ? 'manifest' : 'index.html',
    initial,
    initialJsBytes: sum(initial, 'bytes'),
    initialJsGzipBytes: sum(initial, 'gzipBytes'),
    later: later.sort((a, b) => b.gzipBytes - a.gzipBytes),
    laterJsGzipBytes: sum(later, 'gzipBytes'),
    css,
    cssGzipBytes: sum(css, 'gzipBytes'),
    targetGzipBytes: TARGET_GZIP,
    routes,
  };
}

const kB = (n: number) => `${(n / 1000).toFixed(1)} kB`;

export function formatBundleReport(r: BundleReport): string[] {
  return [
    `  (f) client first load (${r.source}): ${r.initial.length} JS file(s) ${kB(r.initialJsBytes)} raw, ${kB(r.initialJsGzipBytes)} gzip   target < 250 kB gzip  ${r.initialJsGzipBytes < r.targetGzipBytes ? 'met' : 'MISSED'}`,
    ...r.initial.map((f) => `        ${f.file}  ${kB(f.bytes)} raw, ${kB(f.gzipBytes)} gzip`),
    `      loaded later: ${r.later.length} chunk(s), ${kB(r.laterJsGzipBytes)} gzip${r.later.length ? ` (largest ${r.later[0].file} ${kB(r.later[0].gzipBytes)})` : ''}; CSS ${kB(r.cssGzipBytes)} gzip`,
    ...(r.routes
      ? [`      per route (first visit adds, gzip):`, ...r.routes.map((x) => `        ${x.route.padEnd(34)} ${kB(x.gzipBytes).padStart(9)}  (${x.files.length} file(s))`)]
      : [`      per route: no manifest in ${r.distDir} (build with --build for per-route figures)`]),
  ];
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const report = await benchBundle({ build: process.argv.includes('--build') });
  console.log(['', ...formatBundleReport(report), ''].join('\n'));
}
