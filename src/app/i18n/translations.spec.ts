import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import glossary from './glossary.json';
import { LANGUAGES } from './languages';
import { translations as en } from './translations/en';
import { translations as fr } from './translations/fr';
import { translations as sw } from './translations/sw';

type Tree = { [key: string]: string | Tree };

/** `{ a: { b: 'x' } }` → `[['a.b', 'x']]`. */
function flatten(tree: Tree, prefix = ''): [string, string][] {
  return Object.entries(tree).flatMap(([key, value]) =>
    typeof value === 'string' ? [[prefix + key, value] as [string, string]] : flatten(value, `${prefix}${key}.`));
}

const strings = {
  en: new Map(flatten(en as unknown as Tree)),
  sw: new Map(flatten(sw as unknown as Tree)),
  fr: new Map(flatten(fr as unknown as Tree)),
};
const params = (text: string) => [...text.matchAll(/\{\{\s*(\w+)\s*\}\}/g)].map((match) => match[1]).sort();

describe('translations', () => {
  it('come in every language the app offers', () => {
    expect(Object.keys(strings).sort()).toEqual(LANGUAGES.map((language) => language.code).sort());
  });

  it.each(['sw', 'fr'] as const)('%s has exactly the keys English has', (code) => {
    const missing = [...strings.en.keys()].filter((key) => !strings[code].has(key));
    const extra = [...strings[code].keys()].filter((key) => !strings.en.has(key));
    expect({ missing, extra }).toEqual({ missing: [], extra: [] });
  });

  it.each(['en', 'sw', 'fr'] as const)('%s has no empty string', (code) => {
    expect([...strings[code]].filter(([, text]) => text.trim() === '').map(([key]) => key)).toEqual([]);
  });

  it.each(['sw', 'fr'] as const)('%s keeps the placeholders of every English string', (code) => {
    const differing = [...strings.en]
      .filter(([key, text]) => strings[code].has(key) && params(text).join() !== params(strings[code].get(key)!).join())
      .map(([key]) => key);
    expect(differing).toEqual([]);
  });

  it('say the trade terms the way the glossary does', () => {
    const words = (text: string) => text.toLowerCase().normalize('NFC');
    const inconsistent: string[] = [];
    for (const term of glossary.terms) {
      const englishForm = new RegExp(`(^|[^\\p{L}])(${term.en.join('|')})($|[^\\p{L}])`, 'iu');
      for (const [key, english] of strings.en) {
        // Placeholders are names in the code, not words a person reads.
        if (!englishForm.test(english.replace(/\{\{[^}]*\}\}/g, ' '))) continue;
        const swahili = words(strings.sw.get(key) ?? '');
        const french = words(strings.fr.get(key) ?? '');
        // Kiswahili builds words with prefixes (rundo, marundo), so a form may sit inside a word.
        if (!term.sw.some((form) => swahili.includes(form))) inconsistent.push(`sw ${key}: "${term.en[0]}" → ${term.sw.join('/')}`);
        if (!term.fr.some((form) => new RegExp(`(^|[^\\p{L}])${form}`, 'u').test(french))) {
          inconsistent.push(`fr ${key}: "${term.en[0]}" → ${term.fr.join('/')}`);
        }
      }
    }
    expect(inconsistent).toEqual([]);
  });
});

describe('translation keys used in the code', () => {
  const namespaces = Object.keys(en);
  const keyLiteral = new RegExp(`['"\`]((?:${namespaces.join('|')})\\.[\\w.-]+)['"\`]`, 'g');

  function sources(folder: string): string[] {
    return readdirSync(folder).flatMap((name) => {
      const path = join(folder, name);
      if (statSync(path).isDirectory()) return sources(path);
      return /\.(ts|html)$/.test(name) && !name.endsWith('.spec.ts') ? [path] : [];
    });
  }

  it('all exist in English (so in every language)', () => {
    const unknown: string[] = [];
    for (const file of sources(join(__dirname, '..'))) {
      for (const match of readFileSync(file, 'utf8').matchAll(keyLiteral)) {
        const key = match[1];
        // A key that ends in '.' is a prefix completed at run time (e.g. 'common.terms.material.' + value).
        if (key.endsWith('.')) {
          if (![...strings.en.keys()].some((known) => known.startsWith(key))) unknown.push(`${file}: ${key}`);
        } else if (!strings.en.has(key)) {
          unknown.push(`${file}: ${key}`);
        }
      }
    }
    expect(unknown).toEqual([]);
  });

  it('every namespace in the registry is in the translations', () => {
    const registry = readFileSync(join(__dirname, 'namespaces.mjs'), 'utf8');
    const registered = [...registry.matchAll(/\['(\w+)', 'src\//g)].map((match) => match[1]);
    expect(registered.sort()).toEqual([...namespaces].sort());
  });
});
