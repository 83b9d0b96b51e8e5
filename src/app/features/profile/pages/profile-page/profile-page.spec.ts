import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { AuthSession, type SessionUser } from '../../../../core/auth/auth-session';
import ProfilePage from './profile-page';

const sampler: SessionUser = {
  id: 'u1', organizationId: 'o', email: 'amani@crew.test', name: 'Amani', role: 'sampler', labName: null,
  siteIds: ['s1'], sites: [{ id: 's1', code: 'JR', name: 'Jackal Ridge' }], deviceId: 'd1', deviceName: 'Crew phone 3',
};

async function render() {
  localStorage.clear();
  TestBed.configureTestingModule({ imports: [ProfilePage], providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()] });
  TestBed.inject(AuthSession).signIn(sampler, { accessToken: 'a', refreshToken: 'r' });
  const fixture = TestBed.createComponent(ProfilePage);
  fixture.autoDetectChanges();
  const server = TestBed.inject(HttpTestingController);
  server.expectOne('/api/me').flush(sampler);
  await fixture.whenStable();
  return { fixture, element: fixture.nativeElement as HTMLElement, server };
}

async function choose(fixture: Awaited<ReturnType<typeof render>>['fixture'], code: 'sw' | 'fr') {
  const element = fixture.nativeElement as HTMLElement;
  (element.querySelector('hs-language-picker button.toggle') as HTMLButtonElement).click();
  await fixture.whenStable();
  (element.querySelector(`hs-language-picker button[lang=${code}]`) as HTMLButtonElement).click();
  await fixture.whenStable();
}

describe('ProfilePage', () => {
  afterEach(() => localStorage.clear());

  it('names the role and sites, and offers the language under its own heading', async () => {
    const { element } = await render();
    expect(element.querySelector('dl')?.textContent).toContain('Sampler (field crew)');
    expect(element.querySelector('dl')?.textContent).toContain('JR · Jackal Ridge');
    const headings = [...element.querySelectorAll('h2')].map((heading) => heading.textContent?.trim());
    expect(headings).toContain('translate Language');
  });

  it('switches the whole page from its own picker: Kiswahili, then French, and remembers the choice for this person', async () => {
    const { fixture, element } = await render();

    await choose(fixture, 'sw');
    expect(element.querySelector('dl')?.textContent).toContain('Mchukua sampuli (timu ya uwanjani)');
    expect(element.textContent).toContain('Kifaa hiki');
    expect(localStorage.getItem('heapsight.language.u1')).toBe('sw');

    await choose(fixture, 'fr');
    expect(element.querySelector('dl')?.textContent).toContain('Échantillonneur (équipe de terrain)');
    expect(element.textContent).toContain('Se déconnecter');
    expect(element.textContent).not.toContain('This device');
  });

  it('keeps a new device name on the phone when offline and says why in the reader’s language', async () => {
    const { fixture, element, server } = await render();
    await choose(fixture, 'fr');
    const input = element.querySelector('input[maxlength="100"]') as HTMLInputElement;
    input.value = 'Téléphone 4';
    input.dispatchEvent(new Event('input'));
    (element.querySelector('form.device button[type=submit]') as HTMLButtonElement).click();
    server.expectOne('/api/me/device').error(new ProgressEvent('error'), { status: 0, statusText: '' });
    await new Promise((resolve) => setTimeout(resolve, 0));
    await fixture.whenStable();

    expect(element.querySelector('p[role=status]')?.textContent)
      .toBe('Gardé sur ce téléphone ; le serveur le recevra à la prochaine connexion (pas de connexion au serveur)');
    expect(TestBed.inject(AuthSession).device().name).toBe('Téléphone 4');
  });
});
