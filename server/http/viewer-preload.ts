import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';

/**
 * The app page for a viewer link, with preload hints for the viewer's code. Opened cold, the browser
 * otherwise finds the viewer's chunks level by level (each import is seen only once its parent has
 * arrived), and the first tiles wait for the deepest one. The list is read once from the build: the
 * chunk holding the viewer page (found by its element name), the chunks it imports dynamically (konva,
 * the stage), and every chunk those import statically. Rebuilt when index.html changes.
 */

const VIEWER_ELEMENT = '"ef-viewer-page"';
const STATIC_IMPORT = /(?:from|import)\s*"\.\/(chunk-[A-Za-z0-9]+\.js)"/g;
const DYNAMIC_IMPORT = /import\(\s*"\.\/(chunk-[A-Za-z0-9]+\.js)"\s*\)/g;

let cached: { builtAt: number; html: string } | null = null;

/** index.html with the viewer's preload links, or null when the client is not built. */
export function viewerPage(clientDir: string): string | null {
  const index = path.join(clientDir, 'index.html');
  let builtAt: number;
  try {
    builtAt = statSync(index).mtimeMs;
  } catch {
    return null;
  }
  if (cached?.builtAt === builtAt) return cached.html;
  const page = readFileSync(index, 'utf8');
  // The app's own first chunks are in index.html already.
  const links = viewerChunks(clientDir)
    .filter((chunk) => !page.includes(chunk))
    .map((chunk) => `<link rel="modulepreload" href="${chunk}">`)
    .join('');
  const html = page.replace('</head>', `${links}</head>`);
  cached = { builtAt, html };
  return html;
}

/** The viewer page's chunk first, then everything it needs; empty when no chunk holds the page. */
export function viewerChunks(clientDir: string): string[] {
  const code = new Map<string, string>();
  for (const name of readdirSync(clientDir)) {
    if (/^chunk-[A-Za-z0-9]+\.js$/.test(name)) code.set(name, readFileSync(path.join(clientDir, name), 'utf8'));
  }
  const page = [...code].find(([, text]) => text.includes(VIEWER_ELEMENT))?.[0];
  if (!page) return [];
  const wanted = [page, ...matches(code.get(page)!, DYNAMIC_IMPORT)];
  const seen = new Set<string>();
  while (wanted.length > 0) {
    const name = wanted.shift()!;
    if (seen.has(name) || !code.has(name)) continue;
    seen.add(name);
    wanted.push(...matches(code.get(name)!, STATIC_IMPORT));
  }
  return [...seen];
}

function matches(text: string, pattern: RegExp): string[] {
  return [...text.matchAll(pattern)].map((m) => m[1]!);
}
