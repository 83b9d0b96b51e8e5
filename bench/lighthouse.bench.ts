/**
 * Lighthouse (mobile emulation, default throttling) on the built app as our server sends it,
 * beside the same build from plain express.static measured in the same run.
 * Goal (issue 9): performance ≥ 90, accessibility ≥ 95.
 */
import * as chromeLauncher from 'chrome-launcher';
import { reportFigure } from './report';
import { startHeapsight, startPlainStatic } from './support/servers';

const CHROMIUM_FLAGS = [
  '--headless=new', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage',
];

interface Scores {
  readonly performance: number;
  readonly accessibility: number;
  readonly largestContentfulPaintMs: number;
}

async function audit(url: string): Promise<Scores> {
  // lighthouse is ESM-only; this file runs as CommonJS under tsx, so load it dynamically.
  const { default: lighthouse } = await import('lighthouse');
  const chrome = await chromeLauncher.launch({ chromePath: process.env['CHROME_PATH'] ?? '/usr/bin/chromium', chromeFlags: CHROMIUM_FLAGS });
  try {
    const result = await lighthouse(url, { port: chrome.port, output: 'json', logLevel: 'error', onlyCategories: ['performance', 'accessibility'] });
    if (!result) throw new Error(`Lighthouse returned nothing for ${url}`);
    const { categories, audits } = result.lhr;
    return {
      performance: Math.round((categories['performance']?.score ?? 0) * 100),
      accessibility: Math.round((categories['accessibility']?.score ?? 0) * 100),
      largestContentfulPaintMs: Math.round(audits['largest-contentful-paint']?.numericValue ?? 0),
    };
  } finally {
    await chrome.kill();
  }
}

async function main(): Promise<void> {
  const ours = await startHeapsight();
  const plain = await startPlainStatic();
  try {
    const oursScores = await audit(`${ours.url}/capture`);
    const plainScores = await audit(`${plain.url}/capture`);
    reportFigure({
      group: 'lighthouse', name: 'mobile performance score, /capture', value: oursScores.performance, unit: 'points',
      baselineName: 'same build, plain express.static', baselineValue: plainScores.performance, higherIsBetter: true, goal: '>= 90',
    });
    reportFigure({
      group: 'lighthouse', name: 'mobile largest contentful paint, /capture', value: oursScores.largestContentfulPaintMs, unit: 'ms',
      baselineName: 'same build, plain express.static', baselineValue: plainScores.largestContentfulPaintMs, higherIsBetter: false,
    });
    reportFigure({
      group: 'lighthouse', name: 'accessibility score, /capture', value: oursScores.accessibility, unit: 'points',
      baselineName: 'same build, plain express.static', baselineValue: plainScores.accessibility, higherIsBetter: true, goal: '>= 95',
    });
  } finally {
    await ours.stop();
    await plain.stop();
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
