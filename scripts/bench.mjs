#!/usr/bin/env node
// Runs every bench/*.bench.ts (or those named on the command line) in its own process,
// gathers the BENCH lines they print, and writes bench/results.json and bench/results.md.
// BENCH_SIZE=full gives the quoted figures; the default (smoke) is quick enough for CI.
import { spawnSync } from 'node:child_process';
import { readdirSync, writeFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';

const root = new URL('..', import.meta.url).pathname;
const benchDir = join(root, 'bench');
const wanted = process.argv.slice(2);
const files = readdirSync(benchDir)
  .filter((file) => file.endsWith('.bench.ts'))
  .filter((file) => wanted.length === 0 || wanted.some((name) => file.includes(name)))
  .sort();

const figures = [];
let failures = 0;
for (const file of files) {
  process.stdout.write(`\n== ${file} (${process.env.BENCH_SIZE ?? 'smoke'})\n`);
  const run = spawnSync(join(root, 'node_modules/.bin/tsx'), [join(benchDir, file)], {
    cwd: root,
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
    env: { ...process.env, NODE_ENV: 'production' },
  });
  for (const line of run.stdout.split('\n')) {
    if (line.startsWith('BENCH ')) {
      figures.push({ file, ...JSON.parse(line.slice(6)) });
    } else if (line.trim()) {
      process.stdout.write(`   ${line}\n`);
    }
  }
  if (run.status !== 0) {
    failures += 1;
    process.stdout.write(`   FAILED (exit ${run.status}): ${run.stderr.slice(-2000)}\n`);
  }
}

const format = (value) => (Math.abs(value) >= 100 ? value.toFixed(0) : value.toPrecision(3));
const rows = figures.map((figure) => {
  const hasBaseline = typeof figure.baselineValue === 'number' && figure.baselineValue > 0 && figure.value > 0;
  const ratio = hasBaseline
    ? figure.higherIsBetter ? figure.value / figure.baselineValue : figure.baselineValue / figure.value
    : null;
  return { ...figure, ratio };
});
const table = [
  '| group | figure | value | baseline | ratio (x better) | goal |',
  '|---|---|---|---|---|---|',
  ...rows.map((row) =>
    `| ${row.group} | ${row.name} | ${format(row.value)} ${row.unit} | ` +
    `${row.baselineName ? `${row.baselineName}: ${format(row.baselineValue)} ${row.unit}` : '-'} | ` +
    `${row.ratio === null ? '-' : format(row.ratio)} | ${row.goal ?? ''} |`),
].join('\n');

mkdirSync(benchDir, { recursive: true });
writeFileSync(join(benchDir, 'results.json'), JSON.stringify({
  measuredAt: new Date().toISOString(), size: process.env.BENCH_SIZE ?? 'smoke', figures: rows,
}, null, 2));
writeFileSync(join(benchDir, 'results.md'), `${table}\n`);
process.stdout.write(`\n${table}\n`);
process.exit(failures === 0 ? 0 : 1);
