import { join } from 'node:path';
import { untranslatedTextIn, untranslatedTextInApp } from '../../testing/untranslated-text';

describe('untranslated text finder', () => {
  it('finds words in text, interpolations, read attributes and string literals', () => {
    const found = untranslatedTextIn(`
      <h1>Piles</h1>
      <p>{{ count }} samples</p>
      <button aria-label="Open the menu"></button>
      <span>{{ isOnline ? 'Online' : 'Offline' }}</span>
    `, 'example.html').map((item) => item.text);
    expect(found).toEqual(['Piles', 'samples', 'Open the menu', 'Online', 'Offline']);
  });

  it('lets through keys, icon ligatures, units, numbers and format arguments', () => {
    const found = untranslatedTextIn(`
      <h1><mat-icon>landscape</mat-icon> {{ 'nav.piles' | transloco }}</h1>
      <p>{{ grade | hsNumber: '1.2-2' }} g/t · {{ tonnes }} t · {{ when | hsDate: 'd MMM y, HH:mm' }}</p>
      <span [class.offline]="state === 'offline'" [attr.aria-label]="'shell.online' | transloco">Heapsight</span>
      <mat-icon>{{ isOnline ? 'cloud_done' : 'cloud_off' }}</mat-icon>
    `, 'example.html');
    expect(found).toEqual([]);
  });

  it('gives the line of the text in its file', () => {
    const file = 'const a = 1;\n@Component({ template: `\n<p>\nHello\n</p>` })';
    const [template] = [file.slice(file.indexOf('`') + 1, file.lastIndexOf('`'))];
    expect(untranslatedTextIn(template, 'x.ts', file, file.indexOf('`') + 1)).toEqual([{ file: 'x.ts', line: 4, text: 'Hello' }]);
  });
});

describe('every template of the app', () => {
  const found = untranslatedTextInApp(join(__dirname, '../../..'));

  it('holds no text a person reads without a translation key', () => {
    expect(found.map((item) => `${item.file}:${item.line} "${item.text}"`)).toEqual([]);
  });

});
