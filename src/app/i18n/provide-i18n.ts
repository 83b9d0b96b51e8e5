import { EnvironmentProviders, inject, isDevMode, makeEnvironmentProviders, provideAppInitializer } from '@angular/core';
import { TitleStrategy } from '@angular/router';
import { provideTransloco } from '@jsverse/transloco';
import { AppLanguage } from './app-language';
import { LANGUAGES, DEFAULT_LANGUAGE } from './languages';
import { BundledTranslationLoader } from './translation-loader';
import { TranslatedTitleStrategy } from './translated-title-strategy';

/** Transloco with Heapsight's three languages; the first screen waits for the remembered one. */
export function provideI18n(): EnvironmentProviders {
  return makeEnvironmentProviders([
    provideTransloco({
      config: {
        availableLangs: LANGUAGES.map((language) => language.code),
        defaultLang: DEFAULT_LANGUAGE,
        fallbackLang: DEFAULT_LANGUAGE,
        reRenderOnLangChange: true,
        prodMode: !isDevMode(),
        missingHandler: { useFallbackTranslation: true, logMissingKey: isDevMode() },
      },
      loader: BundledTranslationLoader,
    }),
    provideAppInitializer(() => inject(AppLanguage).start()),
    { provide: TitleStrategy, useClass: TranslatedTitleStrategy },
  ]);
}
