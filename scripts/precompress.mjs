/**
 * Writes a Brotli (.br) and a gzip (.gz) copy beside every compressible static file of a build
 * (`node scripts/precompress.mjs dist/client`), at the highest levels: done once per build, so the
 * server sends them without compressing anything per request (scripts/compressed-static.mjs).
 */
import { readdir, readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { promisify } from 'node:util';
import zlib from 'node:zlib';

export const PRECOMPRESSED_TYPES = {
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.json': 'application/json',
  '.txt': 'text/plain; charset=utf-8',
  '.html': 'text/html; charset=utf-8',
  '.xml': 'application/xml',
};
const brotli = promisify(zlib.brotliCompress);
const gzip = promisify(zlib.gzip);
const MIN_BYTES = 1024;

async function* files(dir) {
  for (const entry of await readdir(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) yield* files(full);
    else yield full;
  }
}

export async function precompress(root) {
  let count = 0;
  for await (const file of files(root)) {
    if (!(path.extname(file) in PRECOMPRESSED_TYPES)) continue;
    const bytes = await readFile(file);
    if (bytes.length < MIN_BYTES) continue;
    const size = bytes.length;
    await writeFile(
      `${file}.br`,
      await brotli(bytes, {
        params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 11, [zlib.constants.BROTLI_PARAM_SIZE_HINT]: size },
      }),
    );
    await writeFile(`${file}.gz`, await gzip(bytes, { level: 9 }));
    count++;
  }
  return count;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const root = process.argv[2] ?? 'dist/client';
  const n = await precompress(root);
  console.log(`precompress: ${n} files in ${root}`);
}
