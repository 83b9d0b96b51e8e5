import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { AppLanguage } from '../../../../i18n/app-language';
import OutboxPage, { splitLinks } from './outbox-page';

describe('splitLinks', () => {
  it('turns web addresses into links and leaves the rest as text', () => {
    expect(splitLinks('Choose it here:\nhttp://heapsight.test/set-password?token=abc\nThanks')).toEqual([
      { text: 'Choose it here:\n', isLink: false },
      { text: 'http://heapsight.test/set-password?token=abc', isLink: true },
      { text: '\nThanks', isLink: false },
    ]);
  });

  it('never makes a link of another scheme', () => {
    expect(splitLinks('javascript:alert(1)')).toEqual([{ text: 'javascript:alert(1)', isLink: false }]);
  });
});

describe('OutboxPage', () => {
  const item = {
    id: 'm1', recipients: ['lab@kestrel.test'], subject: 'Lab batch JR-B0003', status: 'sent', errorMessage: null,
    attachments: [{ filename: 'JR-B0003.csv', contentType: 'text/csv', sizeBytes: 12345 }], createdAt: '2026-03-02T09:30:00.000Z',
  };

  async function render() {
    TestBed.configureTestingModule({ imports: [OutboxPage], providers: [provideHttpClient(), provideHttpClientTesting()] });
    const fixture = TestBed.createComponent(OutboxPage);
    fixture.autoDetectChanges();
    const server = TestBed.inject(HttpTestingController);
    server.expectOne((request) => request.url === '/api/outbox').flush({ items: [item], total: 1 });
    await new Promise((resolve) => setTimeout(resolve, 0));
    await fixture.whenStable();
    return { fixture, element: fixture.nativeElement as HTMLElement, server };
  }

  afterEach(() => localStorage.clear());

  it('lists sent e-mail with its status and attachments, in Kiswahili and in French with French digits', async () => {
    const { fixture, element, server } = await render();
    expect(element.querySelector('.summary')?.textContent).toContain('To lab@kestrel.test');
    expect(element.querySelector('.summary')?.textContent).toContain('sent · 1 attachment(s)');

    await TestBed.inject(AppLanguage).use('sw');
    await fixture.whenStable();
    expect(element.querySelector('h1')?.textContent).toContain('Barua zilizotumwa');
    expect(element.querySelector('.summary')?.textContent).toContain('imetumwa · viambatisho 1');

    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();
    (element.querySelector('.summary') as HTMLButtonElement).click();
    server.expectOne('/api/outbox/m1').flush({ ...item, textBody: 'Résultats ci-joints.' });
    await new Promise((resolve) => setTimeout(resolve, 0));
    await fixture.whenStable();
    expect(element.querySelector('.summary')?.textContent).toContain('À lab@kestrel.test');
    expect(element.querySelector('.body')?.textContent).toContain('JR-B0003.csv (12\u202f345 octets)');
  });

  it('explains a refusal to open a message in the reader’s language', async () => {
    const { fixture, element, server } = await render();
    await TestBed.inject(AppLanguage).use('fr');
    (element.querySelector('.summary') as HTMLButtonElement).click();
    server.expectOne('/api/outbox/m1').flush({ error: { code: 'not_found', message: 'No such message', details: null } }, { status: 404, statusText: 'Not Found' });
    await new Promise((resolve) => setTimeout(resolve, 0));
    await fixture.whenStable();
    expect(element.querySelector('[role=alert]')?.textContent).toContain('Ce message n\'est plus sur le serveur');
  });
});
