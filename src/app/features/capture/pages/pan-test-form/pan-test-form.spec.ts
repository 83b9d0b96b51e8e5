import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { AppLanguage } from '../../../../i18n/app-language';
import { CaptureStore } from '../../capture.store';
import PanTestForm from './pan-test-form';

const SAMPLE = { id: '5b000000-0000-4000-8000-000000000001', code: 'JR-07-0001', moisturePct: 0 };

async function render(language: 'en' | 'fr') {
  TestBed.configureTestingModule({
    imports: [PanTestForm],
    providers: [provideRouter([]), { provide: CaptureStore, useValue: { samples: signal([SAMPLE]), savePanTest: jest.fn() } }],
  });
  await TestBed.inject(AppLanguage).use(language);
  const fixture = TestBed.createComponent(PanTestForm);
  fixture.detectChanges();
  await fixture.whenStable();
  const page = fixture.nativeElement as HTMLElement;
  const button = (label: string) => page.querySelector<HTMLButtonElement>(`button[aria-label="${label}"]`)!;
  const grade = () => page.querySelector('[role="status"]')!.textContent!.trim();
  const typeGold = (mg: string) => {
    const input = page.querySelectorAll<HTMLInputElement>('input[type="number"]')[1];
    input.value = mg;
    input.dispatchEvent(new Event('input'));
    fixture.detectChanges();
  };
  return { fixture, page, button, grade, typeGold };
}

describe('PanTestForm', () => {
  it('asks for colours or weighed gold before it shows a grade, then shows it live', async () => {
    const { button, grade, typeGold } = await render('en');
    expect(button('More fine colours')).not.toBeNull();
    expect(grade()).toBe('Count the colours, or weigh the gold, to see the grade.');

    typeGold('1.5');

    // 1.5 mg of gold from 2 kg panned, dry, at the engine's default pan efficiency of 0.8:
    // 1.5 / 2 / 0.8 = 0.9375 mg/kg, and 1 mg/kg = 1 g/t by definition.
    expect(grade()).toBe('Estimated grade 0.94 g/t');
  });

  it('speaks French: labels, counter buttons, and a decimal comma in the grade', async () => {
    const { page, button, grade, typeGold } = await render('fr');
    expect(page.querySelector('h1')!.textContent).toBe('Test à la batée');
    expect(button('Plus de paillettes fines')).not.toBeNull();
    expect(button('Moins de paillettes très grossières')).not.toBeNull();
    expect(page.textContent).toContain('Fin, 0,15–0,425 mm');

    typeGold('1.5');

    expect(grade()).toBe('Teneur estimée 0,94 g/t');
  });
});
