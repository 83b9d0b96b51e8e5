/**
 * The languages Heapsight speaks. `locale` is the Angular/CLDR locale used to format numbers and
 * dates; units stay metric in every language.
 */
export const LANGUAGES = [
  { code: 'en', name: 'English', locale: 'en' },
  { code: 'sw', name: 'Kiswahili', locale: 'sw' },
  { code: 'fr', name: 'Français', locale: 'fr' },
] as const;

export type LanguageCode = (typeof LANGUAGES)[number]['code'];

export const DEFAULT_LANGUAGE: LanguageCode = 'en';

export function isLanguageCode(value: unknown): value is LanguageCode {
  return LANGUAGES.some((language) => language.code === value);
}

export function localeOf(code: LanguageCode): string {
  return LANGUAGES.find((language) => language.code === code)?.locale ?? 'en';
}

/** The first of the browser's preferred languages that Heapsight speaks, else English. */
export function preferredLanguage(browserLanguages: readonly string[]): LanguageCode {
  for (const tag of browserLanguages) {
    const primary = tag.toLowerCase().split('-')[0];
    if (isLanguageCode(primary)) return primary;
  }
  return DEFAULT_LANGUAGE;
}
