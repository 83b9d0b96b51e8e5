#!/usr/bin/env node
// After `ng build`: writes a brotli (.br, quality 11) and a gzip (.gz, level 9) copy beside every
// text file of the build worth compressing, so the server (server/web/static-app.ts) sends them as
// they are instead of compressing each response on the fly at a lower level. Copies that would not
// be smaller are not written. Leaves the build's own files (and so ngsw.json's hashes) untouched.
import { readFileSync, readdirSync, statSync, writeFileSync, existsSync, rmSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { brotliCompressSync, gzipSync, constants } from 'node:zlib';

const COMPRESSIBLE = /\.(html|js|mjs|css|json|webmanifest|svg|txt)$/i;
const MIN_BYTES = 1024;
const root = new URL('..', import.meta.url).pathname;
const browserDir = resolve(root, process.argv[2] ?? 'dist/heapsight/browser');
if (!existsSync(join(browserDir, 'index.html'))) {
  console.error(`precompress: ${browserDir}/index.html is missing; run ng build first`);
  process.exit(1);
}

function* filesIn(dir) {
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) yield* filesIn(path);
    else if (entry.isFile()) yield path;
  }
}

let files = 0, rawBytes = 0, brBytes = 0, gzBytes = 0;
for (const file of [...filesIn(browserDir)]) {
  if (!COMPRESSIBLE.test(file) || statSync(file).size < MIN_BYTES) continue;
  const bytes = readFileSync(file);
  const copies = {
    '.br': brotliCompressSync(bytes, { params: {
      [constants.BROTLI_PARAM_QUALITY]: constants.BROTLI_MAX_QUALITY,
      [constants.BROTLI_PARAM_SIZE_HINT]: bytes.length,
      [constants.BROTLI_PARAM_MODE]: constants.BROTLI_MODE_TEXT,
    } }),
    '.gz': gzipSync(bytes, { level: 9 }),
  };
  for (const [suffix, compressed] of Object.entries(copies)) {
    if (compressed.length < bytes.length) writeFileSync(file + suffix, compressed);
    else rmSync(file + suffix, { force: true });
  }
  files += 1;
  rawBytes += bytes.length;
  brBytes += Math.min(copies['.br'].length, bytes.length);
  gzBytes += Math.min(copies['.gz'].length, bytes.length);
}
const kb = (n) => `${(n / 1000).toFixed(1)} kB`;
console.log(`precompress: ${files} files in ${relative(root, browserDir)}: ${kb(rawBytes)} raw, ${kb(brBytes)} brotli, ${kb(gzBytes)} gzip`);
