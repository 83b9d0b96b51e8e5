import { TestBed } from '@angular/core/testing';
import { TranslocoService } from '@jsverse/transloco';
import { AuthSession, type SessionUser } from '../core/auth/auth-session';
import { AppLanguage } from './app-language';
import { preferredLanguage } from './languages';

const person = (id: string): SessionUser => ({
  id, organizationId: 'org', email: `${id}@example.test`, name: id, role: 'sampler', labName: null,
  siteIds: [], sites: [], deviceId: null, deviceName: null,
});

describe('AppLanguage', () => {
  beforeEach(() => localStorage.clear());

  it('takes the first browser language it speaks, else English', () => {
    expect(preferredLanguage(['sw-TZ', 'en-GB'])).toBe('sw');
    expect(preferredLanguage(['de-DE', 'fr-CD'])).toBe('fr');
    expect(preferredLanguage(['pt-BR'])).toBe('en');
    expect(preferredLanguage([])).toBe('en');
  });

  it('switches every string and the locale, and remembers the choice for the device and the person', async () => {
    const session = TestBed.inject(AuthSession);
    session.user.set(person('amina'));
    const language = TestBed.inject(AppLanguage);
    await language.use('fr');
    expect(TestBed.inject(TranslocoService).translate('common.nav.piles')).toBe('Tas');
    expect(language.locale()).toBe('fr');
    expect(document.documentElement.lang).toBe('fr');
    expect(localStorage.getItem('heapsight.language')).toBe('fr');
    expect(localStorage.getItem('heapsight.language.amina')).toBe('fr');
  });

  it('starts in the language the signed-in person chose, over the device default', async () => {
    localStorage.setItem('heapsight.language', 'fr');
    localStorage.setItem('heapsight.language.juma', 'sw');
    TestBed.inject(AuthSession).user.set(person('juma'));
    const language = TestBed.inject(AppLanguage);
    await language.start();
    expect(language.active()).toBe('sw');
  });

  it('ignores a remembered value it does not speak', async () => {
    localStorage.setItem('heapsight.language', 'xx');
    const language = TestBed.inject(AppLanguage);
    await language.start();
    expect(['en', 'sw', 'fr']).toContain(language.active());
  });
});
