import { TestBed } from '@angular/core/testing';
import { LanguagePicker } from './language-picker';

describe('LanguagePicker', () => {
  beforeEach(() => localStorage.clear());

  async function render() {
    const fixture = TestBed.createComponent(LanguagePicker);
    fixture.detectChanges();
    await fixture.whenStable();
    return fixture;
  }

  it('offers each language written in itself and switches the app to the one chosen', async () => {
    const fixture = await render();
    const element = fixture.nativeElement as HTMLElement;
    (element.querySelector('button.toggle') as HTMLButtonElement).click();
    fixture.detectChanges();
    const choices = [...element.querySelectorAll('.choices button')] as HTMLButtonElement[];
    expect(choices.map((choice) => choice.querySelector('span')?.textContent)).toEqual(['English', 'Kiswahili', 'Français']);

    choices[1].click();
    await fixture.whenStable();
    fixture.detectChanges();
    expect(element.querySelector('.code')?.textContent).toBe('sw');
    expect(element.querySelector('button.toggle')?.getAttribute('aria-label')).toBe('Lugha: Kiswahili');
    expect(document.documentElement.lang).toBe('sw');
    expect(localStorage.getItem('heapsight.language')).toBe('sw');
  });
});
