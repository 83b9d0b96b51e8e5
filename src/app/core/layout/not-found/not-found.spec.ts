import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { AppLanguage } from '../../../i18n/app-language';
import NotFound from './not-found';

describe('NotFound', () => {
  afterEach(() => localStorage.clear());

  it('says the address is unknown and leads back to Capture, in the language chosen', async () => {
    TestBed.configureTestingModule({ imports: [NotFound], providers: [provideRouter([])] });
    const fixture = TestBed.createComponent(NotFound);
    fixture.autoDetectChanges();
    const element = fixture.nativeElement as HTMLElement;
    expect(element.querySelector('h1')?.textContent).toBe('Page not found');
    expect(element.querySelector('a')?.getAttribute('href')).toBe('/capture');

    await TestBed.inject(AppLanguage).use('sw');
    await fixture.whenStable();
    expect(element.querySelector('h1')?.textContent).toBe('Ukurasa haupatikani');

    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();
    expect(element.querySelector('a')?.textContent).toBe('Aller à Saisie');
  });
});
