// Lists template text that has no translation key: `npx tsx scripts/untranslated-text.ts [path-filter]`.
// The same finder runs in src/app/i18n/untranslated-text.spec.ts, which fails on any hit.
import { join } from 'node:path';
import { untranslatedTextInApp } from '../src/testing/untranslated-text';

const filter = process.argv[2] ?? '';
const found = untranslatedTextInApp(join(__dirname, '..')).filter((item) => item.file.includes(filter));
for (const item of found) console.log(`${item.file}:${item.line}  ${item.text}`);
console.log(`${found.length} untranslated text(s)${filter ? ` under "${filter}"` : ''}`);
