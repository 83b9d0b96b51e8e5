#!/usr/bin/env node
// After `ng build`: the gzip size of the initial bundle (what index.html loads before the app can
// start: its stylesheet, modulepreloads and module scripts), checked against the budget the
// Angular builder cannot express (it budgets raw bytes only; angular.json holds the raw 650 kB).
// Fails above 180 kB gzip. Lists the lazy chunks too, largest first. Sizes in kB of 1000 bytes,
// as the Angular CLI prints them; gzip at level 9, as a precompressing server would send them.
import { readFileSync, readdirSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';

const GZIP_BUDGET_KB = 180;
const root = new URL('..', import.meta.url).pathname;
const browserDir = join(root, process.argv[2] ?? 'dist/heapsight/browser');
const indexFile = join(browserDir, 'index.html');
if (!existsSync(indexFile)) {
  console.error(`check-bundle-size: ${indexFile} is missing; run ng build first`);
  process.exit(1);
}
const html = readFileSync(indexFile, 'utf8');
const initial = new Set();
for (const tag of html.match(/<(script|link)\b[^>]*>/g) ?? []) {
  const isScript = tag.startsWith('<script') && /type="module"/.test(tag);
  const isLoaded = tag.startsWith('<link') && /rel="(stylesheet|modulepreload)"/.test(tag);
  const target = /(?:src|href)="([^"]+)"/.exec(tag)?.[1];
  if ((isScript || isLoaded) && target && !/^[a-z]+:/i.test(target)) initial.add(target.replace(/^\.?\//, ''));
}
const sizeOf = (name) => {
  const bytes = readFileSync(join(browserDir, name));
  return { name, rawKb: bytes.length / 1000, gzipKb: gzipSync(bytes, { level: 9 }).length / 1000 };
};
const initialSizes = [...initial].map(sizeOf);
const total = initialSizes.reduce((sum, file) => ({ rawKb: sum.rawKb + file.rawKb, gzipKb: sum.gzipKb + file.gzipKb }), { rawKb: 0, gzipKb: 0 });
const lazy = readdirSync(browserDir).filter((name) => /\.js$/.test(name) && !initial.has(name) && !/^(ngsw-worker|safety-worker|worker-basic)/.test(name)).map(sizeOf).sort((a, b) => b.rawKb - a.rawKb);
const row = (file) => `  ${file.name.padEnd(28)} ${file.rawKb.toFixed(1).padStart(8)} kB raw ${file.gzipKb.toFixed(1).padStart(7)} kB gzip`;
console.log('Initial bundle (loaded by index.html):');
initialSizes.sort((a, b) => b.rawKb - a.rawKb).forEach((file) => console.log(row(file)));
console.log(row({ name: 'total', ...total }));
console.log(`Lazy chunks (${lazy.length}; the ng build output above names them), largest first:`);
lazy.slice(0, 12).forEach((file) => console.log(row(file)));
if (total.gzipKb > GZIP_BUDGET_KB) {
  console.error(`✖ initial bundle is ${total.gzipKb.toFixed(1)} kB gzip, over the ${GZIP_BUDGET_KB} kB budget`);
  process.exit(1);
}
console.log(`✔ initial bundle ${total.gzipKb.toFixed(1)} kB gzip, within the ${GZIP_BUDGET_KB} kB budget`);
