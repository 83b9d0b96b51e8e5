import { registerLocaleData } from '@angular/common';
import { Injectable } from '@angular/core';
import type { Translation, TranslocoLoader } from '@jsverse/transloco';
import type { LanguageCode } from './languages';

/**
 * Each language is its own lazy chunk (its strings plus its CLDR number and date data), so a phone
 * downloads only the languages it uses; the service worker caches the chunks with the rest of the
 * app, so switching language works offline.
 */
const BUNDLES: Record<LanguageCode, () => Promise<Translation>> = {
  en: async () => (await import('./translations/en')).translations,
  sw: async () => {
    const [{ translations }, locale] = await Promise.all([import('./translations/sw'), import('@angular/common/locales/sw')]);
    registerLocaleData(locale.default, 'sw');
    return translations;
  },
  fr: async () => {
    const [{ translations }, locale] = await Promise.all([import('./translations/fr'), import('@angular/common/locales/fr')]);
    registerLocaleData(locale.default, 'fr');
    return translations;
  },
};

@Injectable({ providedIn: 'root' })
export class BundledTranslationLoader implements TranslocoLoader {
  getTranslation(language: string): Promise<Translation> {
    const load = BUNDLES[language as LanguageCode];
    if (!load) return Promise.reject(new Error(`Heapsight has no translation for "${language}"`));
    return load();
  }
}
