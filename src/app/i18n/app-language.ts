import { DOCUMENT, Injectable, computed, effect, inject, signal, untracked } from '@angular/core';
import { TranslocoService } from '@jsverse/transloco';
import { firstValueFrom } from 'rxjs';
import { AuthSession } from '../core/auth/auth-session';
import { DEFAULT_LANGUAGE, type LanguageCode, isLanguageCode, localeOf, preferredLanguage } from './languages';

const DEVICE_LANGUAGE_KEY = 'heapsight.language';
const userLanguageKey = (userId: string) => `heapsight.language.${userId}`;

/**
 * The language the app speaks now. A choice is remembered for the person signed in (so a shared
 * camp phone switches back when they sign in) and for the device (the sign-in screen and the next
 * start). With nothing remembered, the browser's own preference decides.
 */
@Injectable({ providedIn: 'root' })
export class AppLanguage {
  private readonly transloco = inject(TranslocoService);
  private readonly session = inject(AuthSession);
  private readonly document = inject(DOCUMENT);
  private readonly storage: Storage | null = this.document.defaultView?.localStorage ?? null;

  private readonly activeCode = signal<LanguageCode>(DEFAULT_LANGUAGE);
  readonly active = this.activeCode.asReadonly();
  /** The CLDR locale numbers and dates are formatted in. */
  readonly locale = computed(() => localeOf(this.activeCode()));

  constructor() {
    // When someone signs in on this phone, switch to the language they chose before.
    effect(() => {
      const user = this.session.user();
      if (!user) return;
      const remembered = this.read(userLanguageKey(user.id));
      if (remembered && remembered !== untracked(this.activeCode)) void this.use(remembered);
    });
  }

  /** Loads the remembered (or preferred) language before the first screen renders. */
  start(): Promise<void> {
    const user = this.session.user();
    const browser = this.document.defaultView?.navigator.languages ?? [];
    const code = (user && this.read(userLanguageKey(user.id)))
      ?? this.read(DEVICE_LANGUAGE_KEY)
      ?? preferredLanguage(browser);
    return this.apply(code);
  }

  /** Switches the whole app, at once and offline, and remembers the choice. */
  async use(code: LanguageCode): Promise<void> {
    await this.apply(code);
    this.storage?.setItem(DEVICE_LANGUAGE_KEY, code);
    const user = this.session.user();
    if (user) this.storage?.setItem(userLanguageKey(user.id), code);
  }

  private async apply(code: LanguageCode): Promise<void> {
    await firstValueFrom(this.transloco.load(code));
    this.transloco.setActiveLang(code);
    this.activeCode.set(code);
    this.document.documentElement.lang = code;
  }

  private read(key: string): LanguageCode | null {
    const value = this.storage?.getItem(key);
    return isLanguageCode(value) ? value : null;
  }
}
