import { formatNumber } from '@angular/common';
import type { EngineWarning } from '../../../../shared/engine';

/** Translates a key with parameters (TranslocoService.translate). */
export type Translate = (key: string, params?: Record<string, unknown>) => string;

/**
 * How to say one of the engine's estimate warnings in the active language. The engine gives a code
 * and an English sentence; some sentences carry figures, which are read back out of the sentence
 * (the engine writes them with a decimal point) and written again in the reader's locale.
 * `kinds` names each figure in order: a number, or a material value shown by its translated name.
 */
interface WarningWords {
  readonly key: string;
  readonly figures?: RegExp;
  readonly kinds?: readonly ('number' | 'material')[];
  readonly names?: readonly string[];
}

const NUMBER = '(-?\\d+(?:\\.\\d+)?)';

const WARNINGS: Readonly<Record<string, WarningWords>> = {
  'no-samples': { key: 'piles.warnings.noSamples' },
  'uncalibrated-pan': { key: 'piles.warnings.uncalibratedPan' },
  'single-sample': { key: 'piles.warnings.singleSample' },
  'zero-grade': { key: 'piles.warnings.zeroGrade' },
  'ring-closed': { key: 'piles.warnings.ringClosed' },
  'few-samples': { key: 'piles.warnings.fewSamples', figures: new RegExp(`^Only ${NUMBER} grades`), kinds: ['number'], names: ['n'] },
  'spot-outside-footprint': { key: 'piles.warnings.spotOutsideFootprint', figures: new RegExp(`^${NUMBER} spot height`), kinds: ['number'], names: ['count'] },
  'spot-repeated': { key: 'piles.warnings.spotRepeated', figures: new RegExp(`^${NUMBER} spot height`), kinds: ['number'], names: ['count'] },
  'density-implausible': {
    key: 'piles.warnings.densityImplausible',
    figures: new RegExp(`of ${NUMBER} t/m³ is outside the usual ${NUMBER}–${NUMBER} t/m³ for ([a-z-]+);`),
    kinds: ['number', 'number', 'number', 'material'],
    names: ['density', 'low', 'high', 'material'],
  },
  'crest-vanishes': {
    key: 'piles.warnings.crestVanishes',
    figures: new RegExp(`^At ${NUMBER}° the sides meet ${NUMBER} m up, below the ${NUMBER} m entered`),
    kinds: ['number', 'number', 'number'],
    names: ['angle', 'heightUsed', 'height'],
  },
  'surface-misses-toe': {
    key: 'piles.warnings.surfaceMissesToe',
    figures: new RegExp(`covers ${NUMBER} m² of a ${NUMBER} m² footprint`),
    kinds: ['number', 'number'],
    names: ['covered', 'footprint'],
  },
};

/** A figure as the engine wrote it, in the locale, with as many decimals as the engine gave. */
function localFigure(text: string, locale: string): string {
  const decimals = text.includes('.') ? text.split('.')[1].length : 0;
  return formatNumber(Number(text), locale, `1.${decimals}-${decimals}`);
}

/**
 * The warning in the reader's language. A warning the app has no words for (a new engine code, or a
 * sentence whose figures cannot be read) is shown as the engine wrote it, so nothing is ever hidden.
 */
export function warningText(warning: EngineWarning, translate: Translate, locale: string): string {
  const words = WARNINGS[warning.code];
  if (!words) {
    return warning.message;
  }
  if (!words.figures) {
    return translate(words.key);
  }
  const match = words.figures.exec(warning.message);
  if (!match) {
    return warning.message;
  }
  const params: Record<string, string> = {};
  words.names?.forEach((name, index) => {
    const raw = match[index + 1];
    params[name] = words.kinds?.[index] === 'material' ? translate(`common.terms.material.${raw}`) : localFigure(raw, locale);
  });
  return translate(words.key, params);
}

/** True when the app has words for the warning (used by tests to spot engine wording the app cannot read). */
export function hasWordsFor(warning: EngineWarning): boolean {
  const words = WARNINGS[warning.code];
  return words !== undefined && (!words.figures || words.figures.test(warning.message));
}
