/**
 * The script a page makes the browser fetch before anyone scrolls: read from the page the built
 * server sends (module scripts, modulepreloads, islands hydrated on load, idle or only, and the
 * inline scripts) and the static import graph of each module in the build's client folder
 * (es-module-lexer; `import()` is not followed). Islands hydrated `client:visible` and dynamic
 * imports are listed apart as deferred. Sizes are Brotli at quality 11, what the server sends
 * (scripts/precompress.mjs).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import { init, parse } from 'es-module-lexer';
import { DIST } from './env';

export type Module = { url: string; bytes: number };
export type PageScript = { totalBytes: number; modules: Module[]; inlineBytes: number; deferred: string[] };

const brotliCache = new Map<string, number>();

function brotliBytes(text: string | Buffer): number {
  return zlib.brotliCompressSync(text, { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 11 } }).length;
}

function fileOf(url: string): string {
  const clean = url.split(/[?#]/)[0];
  if (!clean.startsWith('/')) throw new Error(`not a same-origin script path: ${url}`);
  return path.join(DIST, 'client', clean);
}

function moduleBytes(url: string): number {
  let n = brotliCache.get(url);
  if (n === undefined) {
    n = brotliBytes(readFileSync(fileOf(url)));
    brotliCache.set(url, n);
  }
  return n;
}

function attr(tag: string, name: string): string | null {
  const m = tag.match(new RegExp(`\\s${name}="([^"]*)"`));
  return m ? m[1].replace(/&amp;/g, '&') : null;
}

/** Script URLs the page loads at once, the islands it hydrates later, and its inline script text. */
export function scriptsInHtml(html: string): { eager: string[]; deferred: string[]; inline: string[] } {
  const eager: string[] = [];
  const deferred: string[] = [];
  const inline: string[] = [];
  for (const m of html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/g)) {
    const src = attr(m[1], 'src');
    if (src) eager.push(src);
    else if (m[2].trim() && !/type="application\/(ld\+)?json"/.test(m[1])) inline.push(m[2]);
  }
  for (const m of html.matchAll(/<link\b[^>]*>/g))
    if (attr(m[0], 'rel') === 'modulepreload') eager.push(attr(m[0], 'href')!);
  for (const m of html.matchAll(/<astro-island\b[^>]*>/g)) {
    const urls = [attr(m[0], 'component-url'), attr(m[0], 'renderer-url')].filter((u): u is string => !!u);
    if (attr(m[0], 'client') === 'visible') deferred.push(...urls);
    else eager.push(...urls);
  }
  return { eager, deferred, inline };
}

/** The modules and everything they import statically, as absolute paths; `dynamic` collects the targets of `import()`. */
async function staticGraph(entries: string[], dynamic: Set<string> = new Set()): Promise<string[]> {
  await init;
  const seen = new Set<string>();
  const queue = [...entries];
  while (queue.length) {
    const url = queue.shift()!;
    if (seen.has(url)) continue;
    seen.add(url);
    const [imports] = parse(readFileSync(fileOf(url), 'utf8'));
    for (const i of imports) {
      if (!i.n || !i.n.startsWith('.')) continue;
      const target = new URL(i.n, `http://x${url}`).pathname;
      if (i.d === -1) queue.push(target);
      else dynamic.add(target);
    }
  }
  return [...seen];
}

export async function pageScript(html: string): Promise<PageScript> {
  const { eager, deferred, inline } = scriptsInHtml(html);
  const dynamic = new Set<string>();
  const urls = await staticGraph(eager, dynamic);
  const modules = urls.map((url) => ({ url, bytes: moduleBytes(url) })).sort((a, b) => b.bytes - a.bytes);
  const inlineBytes = inline.length ? brotliBytes(inline.join('\n')) : 0;
  const eagerSet = new Set(urls);
  const later = [...new Set((await staticGraph([...deferred, ...dynamic])).filter((u) => !eagerSet.has(u)))];
  return { totalBytes: modules.reduce((s, m) => s + m.bytes, 0) + inlineBytes, modules, inlineBytes, deferred: later };
}
