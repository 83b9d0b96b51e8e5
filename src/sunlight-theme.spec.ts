import { readFileSync } from 'node:fs';
import { join } from 'node:path';

/**
 * The sunlight theme is for screens read in direct sun: every text colour on its background must
 * reach WCAG 2.x level AAA contrast (7:1, success criterion 1.4.6) rather than the 4.5:1 of AA.
 */

/** sRGB channel (0-255) to linear light. WCAG 2.x, definition of "relative luminance". */
function linearChannel(value: number): number {
  const channel = value / 255;
  return channel <= 0.04045 ? channel / 12.92 : ((channel + 0.055) / 1.055) ** 2.4;
}

/** Relative luminance L = 0.2126 R + 0.7152 G + 0.0722 B (WCAG 2.x, definition of "relative luminance"). */
function relativeLuminance(hex: string): number {
  const [red, green, blue] = [1, 3, 5].map((start) => parseInt(hex.slice(start, start + 2), 16));
  return 0.2126 * linearChannel(red) + 0.7152 * linearChannel(green) + 0.0722 * linearChannel(blue);
}

/** (L1 + 0.05) / (L2 + 0.05), lighter over darker (WCAG 2.x, definition of "contrast ratio"). */
function contrastRatio(first: string, second: string): number {
  const [lighter, darker] = [relativeLuminance(first), relativeLuminance(second)].sort((a, b) => b - a);
  return (lighter + 0.05) / (darker + 0.05);
}

/** The `html.sunlight { … }` block's colours: the Material overrides and our own `--hs-*` properties. */
function sunlightColours(): Record<string, string> {
  const styles = readFileSync(join(__dirname, 'styles.scss'), 'utf8');
  const block = /html\.sunlight\s*\{([\s\S]*?)\n\}/.exec(styles)?.[1] ?? '';
  const colours: Record<string, string> = {};
  for (const match of block.matchAll(/(--hs-[a-z-]+|[a-z-]+):\s*(#[0-9a-fA-F]{6})\b/g)) {
    colours[match[1]] = match[2].toLowerCase();
  }
  return colours;
}

const colours = sunlightColours();
const surfaces = ['surface', 'surface-container', 'surface-container-low', 'surface-container-high', 'surface-container-highest'];

/** Every text colour with each background it is drawn on. */
const pairs: [string, string][] = [
  ['on-primary', 'primary'],
  ['on-primary-container', 'primary-container'],
  ['on-secondary-container', 'secondary-container'],
  ...surfaces.flatMap((surface): [string, string][] => [
    ['on-surface', surface], ['on-surface-variant', surface], ['primary', surface],
    ['--hs-ok', surface], ['--hs-warn', surface], ['--hs-fail', surface],
  ]),
];

describe('the sunlight theme', () => {
  it('overrides every colour the contrast pairs name', () => {
    const missing = [...new Set(pairs.flat())].filter((name) => colours[name] === undefined);
    expect(missing).toEqual([]);
  });

  it.each(pairs)('gives %s on %s a contrast ratio of at least 7:1', (text, background) => {
    expect(contrastRatio(colours[text], colours[background])).toBeGreaterThanOrEqual(7);
  });

  it('computes the ratio the WCAG way: black on white is 21:1, a colour on itself 1:1', () => {
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 5);
    expect(contrastRatio('#767676', '#767676')).toBe(1);
    // #767676 on white is the well-known lightest grey that passes AA (4.54:1).
    expect(contrastRatio('#767676', '#ffffff')).toBeCloseTo(4.54, 2);
  });
});
