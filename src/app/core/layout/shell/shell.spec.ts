import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { Shell } from './shell';

describe('Shell', () => {
  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({ imports: [Shell], providers: [provideRouter([])] });
  });

  it('shows the brand and the navigation', async () => {
    const fixture = TestBed.createComponent(Shell);
    fixture.detectChanges();
    await fixture.whenStable();
    const text = fixture.nativeElement.textContent as string;
    expect(text).toContain('Heapsight');
    expect(text).toContain('Capture');
    expect(text).toContain('Safety');
  });

  it('switches to sunlight mode and remembers it on the device', async () => {
    const fixture = TestBed.createComponent(Shell);
    fixture.detectChanges();
    const button = fixture.nativeElement.querySelector('button[aria-label^="Sunlight"]') as HTMLButtonElement;
    button.click();
    fixture.detectChanges();
    await fixture.whenStable();
    expect(document.documentElement.classList.contains('sunlight')).toBe(true);
    expect(localStorage.getItem('heapsight.sunlight')).toBe('1');
  });
});

describe('Shell in another language', () => {
  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({ imports: [Shell], providers: [provideRouter([])] });
  });

  it('names the screens in Kiswahili and French after a switch', async () => {
    const { AppLanguage } = await import('../../../i18n/app-language');
    const fixture = TestBed.createComponent(Shell);
    fixture.detectChanges();
    await TestBed.inject(AppLanguage).use('sw');
    fixture.detectChanges();
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toContain('Kusanya');
    expect(fixture.nativeElement.textContent).toContain('Usalama');

    await TestBed.inject(AppLanguage).use('fr');
    fixture.detectChanges();
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toContain('Saisie');
    expect(fixture.nativeElement.textContent).toContain('Sécurité');
  });
});
