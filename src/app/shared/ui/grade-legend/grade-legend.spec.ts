import { TestBed } from '@angular/core/testing';
import { AppLanguage } from '../../../i18n/app-language';
import { GradeLegend } from './grade-legend';

async function render(inputs: Record<string, unknown>) {
  const fixture = TestBed.createComponent(GradeLegend);
  for (const [name, value] of Object.entries(inputs)) fixture.componentRef.setInput(name, value);
  fixture.autoDetectChanges();
  await fixture.whenStable();
  return { fixture, element: fixture.nativeElement as HTMLElement };
}

describe('GradeLegend', () => {
  it('reads the range in words and numbers, never colour alone', async () => {
    const { element } = await render({ minValue: 0.5, maxValue: 2.5, tickCount: 3 });

    expect(element.querySelector('figcaption')?.textContent).toBe('Grade');
    expect(element.querySelector('figure')?.getAttribute('aria-label')).toBe('Grade legend from 0.50 to 2.50 g/t, light low to dark high');
    expect([...element.querySelectorAll('.ticks span')].map((tick) => tick.textContent)).toEqual(['0.5', '1.5', '2.5']);
    expect(element.querySelector('.ends')?.textContent).toBe('lowg/thigh');
  });

  it('keeps the caption a page gives it', async () => {
    const { element } = await render({ minValue: 0, maxValue: 1, title: 'Pile grade' });

    expect(element.querySelector('figcaption')?.textContent).toBe('Pile grade');
    expect(element.querySelector('figure')?.getAttribute('aria-label')).toMatch(/^Pile grade legend from/);
  });

  it('speaks French with French decimals after a switch', async () => {
    const { fixture, element } = await render({ minValue: 0.5, maxValue: 2.5, tickCount: 3 });

    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();

    expect(element.querySelector('figcaption')?.textContent).toBe('Teneur');
    expect(element.querySelector('figure')?.getAttribute('aria-label')).toBe('Légende « Teneur », de 0,50 à 2,50 g/t : clair pour les valeurs basses, foncé pour les hautes');
    expect([...element.querySelectorAll('.ticks span')].map((tick) => tick.textContent)).toEqual(['0,5', '1,5', '2,5']);
    expect([...element.querySelectorAll('.ends span')].map((end) => end.textContent)).toEqual(['basse', 'g/t', 'haute']);
  });
});
