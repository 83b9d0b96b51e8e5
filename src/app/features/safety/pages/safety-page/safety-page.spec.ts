import { TestBed } from '@angular/core/testing';
import { CAUTIONS } from '../../../../../../shared/safety/cautions';
import { AppLanguage } from '../../../../i18n/app-language';
import SafetyPage from './safety-page';

async function render() {
  const fixture = TestBed.createComponent(SafetyPage);
  fixture.autoDetectChanges();
  await fixture.whenStable();
  return { fixture, element: fixture.nativeElement as HTMLElement };
}

describe('SafetyPage', () => {
  it('shows the heading, the planning statement and every caution in English', async () => {
    const { element } = await render();

    expect(element.querySelector('h1')?.textContent).toBe('Safety at the piles');
    expect(element.querySelector('.statement')?.textContent).toContain('estimates for planning, not a resource statement');
    expect([...element.querySelectorAll('hs-caution-card h3')].map((title) => title.textContent)).toEqual(CAUTIONS.map((caution) => caution.title));
    expect(element.querySelectorAll('hs-caution-card li')).toHaveLength(CAUTIONS.flatMap((caution) => caution.actions).length);
  });

  it('speaks French and Kiswahili after a switch', async () => {
    const { fixture, element } = await render();

    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();
    expect(element.querySelector('h1')?.textContent).toBe('La sécurité sur les tas');
    expect(element.querySelector('.statement')?.textContent).toContain('pas une déclaration de ressources');
    expect(element.querySelector('hs-caution-card h3')?.textContent).toBe('Les vieux résidus peuvent contenir du mercure');

    await TestBed.inject(AppLanguage).use('sw');
    await fixture.whenStable();
    expect(element.querySelector('h1')?.textContent).toBe('Usalama kwenye marundo');
    expect(element.querySelector('hs-caution-card h3')?.textContent).toBe('Mabaki ya zamani yanaweza kuwa na zebaki');
  });
});
