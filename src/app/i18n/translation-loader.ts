import { registerLocaleData } from '@angular/common';
import { Injectable } from '@angular/core';
import type { Translation, TranslocoLoader } from '@jsverse/transloco';
import type { LanguageCode } from './languages';
import { translations as english } from './translations/en';

/**
 * English is in the main bundle: it is the default and every other language's fallback (so each
 * phone loads it anyway), and the first screen waits for the language, so a lazy English chunk was
 * one more round trip before the first paint. Kiswahili and French are each their own lazy chunk
 * (strings plus CLDR number and date data), downloaded only when used; the service worker caches
 * them with the rest of the app, so switching language works offline.
 */
const BUNDLES: Record<LanguageCode, () => Promise<Translation>> = {
  en: () => Promise.resolve(english),
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
