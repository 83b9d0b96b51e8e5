import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { AuthSession, type SessionUser } from '../../../../core/auth/auth-session';
import { AppLanguage } from '../../../../i18n/app-language';
import { eventually } from '../../../../../testing/eventually';
import LabelsPage from './labels-page';

const sampler: SessionUser = {
  id: 'u1', organizationId: 'o', email: 'amani@crew.test', name: 'Amani', role: 'sampler', labName: null,
  siteIds: ['s1'], sites: [{ id: 's1', code: 'JR', name: 'Jackal Ridge' }], deviceId: 'd1', deviceName: 'Crew phone 3',
};

async function render() {
  localStorage.clear();
  TestBed.configureTestingModule({ imports: [LabelsPage], providers: [provideHttpClient(), provideHttpClientTesting()] });
  TestBed.inject(AuthSession).signIn(sampler, { accessToken: 'a', refreshToken: 'r' });
  const fixture = TestBed.createComponent(LabelsPage);
  fixture.autoDetectChanges();
  await fixture.whenStable();
  return { fixture, element: fixture.nativeElement as HTMLElement, server: TestBed.inject(HttpTestingController) };
}

describe('LabelsPage', () => {
  afterEach(() => localStorage.clear());

  it('says how many sheets a count makes, in English, Kiswahili and French', async () => {
    const { fixture, element } = await render();
    expect(element.querySelector('mat-hint')?.textContent).toBe('1 A4 sheet of 24 (3 × 8); at most 240');
    (element.querySelectorAll('.presets button')[1] as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(element.querySelector('mat-hint')?.textContent).toBe('2 A4 sheets of 24 (3 × 8); at most 240');

    await TestBed.inject(AppLanguage).use('sw');
    await fixture.whenStable();
    expect(element.querySelector('h1')?.textContent).toBe('Lebo za sampuli');
    expect(element.querySelector('mat-hint')?.textContent).toBe('Karatasi 2 za A4 zenye lebo 24 (3 × 8); zisizozidi 240');

    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();
    expect(element.querySelector('[data-testid=labels-download]')?.textContent).toContain('Télécharger les étiquettes (PDF)');
  });

  it('explains a refused sheet from the code inside the PDF request’s error body', async () => {
    const { fixture, element, server } = await render();
    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();
    (element.querySelector('[data-testid=labels-download]') as HTMLButtonElement).click();
    const body = { error: { code: 'conflict', message: 'This site has used up its label codes (at most 999999)', details: null } };
    server.expectOne((request) => request.url === '/api/labels.pdf')
      .flush(new Blob([JSON.stringify(body)], { type: 'application/json' }), { status: 409, statusText: 'Conflict' });
    const alert = await eventually(() => element.querySelector('[role=alert]'));
    expect(alert.textContent).toBe('Ce site a épuisé ses codes d\'étiquettes');
  });
});
