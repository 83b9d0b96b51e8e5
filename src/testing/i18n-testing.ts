import { registerLocaleData } from '@angular/common';
import localeFr from '@angular/common/locales/fr';
import localeSw from '@angular/common/locales/sw';
import { importProvidersFrom } from '@angular/core';
import { TranslocoTestingModule } from '@jsverse/transloco';
import { translations as en } from '../app/i18n/translations/en';
import { translations as fr } from '../app/i18n/translations/fr';
import { translations as sw } from '../app/i18n/translations/sw';

registerLocaleData(localeSw, 'sw');
registerLocaleData(localeFr, 'fr');

/**
 * Transloco with the real strings of all three languages loaded up front, English active, so a
 * component test reads the same words a user does. setup-jest.ts adds it to every TestBed.
 */
export function provideI18nTesting() {
  return importProvidersFrom(TranslocoTestingModule.forRoot({
    langs: { en, sw, fr },
    translocoConfig: { availableLangs: ['en', 'sw', 'fr'], defaultLang: 'en', reRenderOnLangChange: true },
    preloadLangs: true,
  }));
}
