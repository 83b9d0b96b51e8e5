import { TestBed } from '@angular/core/testing';
import { meshToApertureUm, minimumSampleMass, unwrap } from '../../../../../../shared/engine';
import { AppLanguage } from '../../../../i18n/app-language';
import SampleMassPage from './sample-mass-page';

async function render() {
  const fixture = TestBed.createComponent(SampleMassPage);
  fixture.autoDetectChanges();
  await fixture.whenStable();
  const element = fixture.nativeElement as HTMLElement;
  const inputs = () => [...element.querySelectorAll<HTMLInputElement>('input[matInput]')];
  const type = async (input: HTMLInputElement, value: string) => {
    input.value = value;
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  };
  return { fixture, element, inputs, type };
}

// The page's starting figures: 2 mm top size, 0.075 mm liberation, 1.5 g/t, 10 % target.
const advice = unwrap(minimumSampleMass({ topSizeMm: 2, liberationSizeMm: 0.075, gradeGpt: 1.5, targetRelativeSd: 0.1 }));

describe('SampleMassPage', () => {
  it('answers the engine\'s minimum mass in English', async () => {
    const { element } = await render();
    expect(element.querySelector('[data-testid="sample-mass-answer"] h2')?.textContent).toBe(`At least ${advice.minimumMassKg.toLocaleString('en', { maximumFractionDigits: 2 })} kg`);
    expect(element.textContent).toContain('Sample mass advisor');
  });

  it('speaks Kiswahili and French after a switch, with French decimals and refusals', async () => {
    const { fixture, element, inputs, type } = await render();
    await TestBed.inject(AppLanguage).use('sw');
    await fixture.whenStable();
    expect(element.querySelector('h1')?.textContent).toBe('Mshauri wa uzito wa sampuli');
    expect(element.querySelector('[data-testid="sample-mass-answer"] h2')?.textContent).toMatch(/^Angalau [\d,.]+ kg$/);

    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();
    const kg = advice.minimumMassKg.toLocaleString('fr', { maximumFractionDigits: 2 }).replace(/\s/g, '\u202f');
    expect(element.querySelector('[data-testid="sample-mass-answer"] h2')?.textContent).toBe(`Au moins ${kg} kg`);
    expect(element.textContent).toContain('0,5');

    await type(inputs()[1], '0');
    expect(element.querySelector('.problems')?.textContent).toContain('Maille de libération de l’or\u00a0: la valeur doit être supérieure à zéro.');
  });

  it('names a mesh that is no sieve', async () => {
    const { element, inputs, type } = await render();
    element.querySelectorAll<HTMLInputElement>('input[type="radio"]')[1].dispatchEvent(new Event('change'));
    await type(inputs()[0], '37');
    expect(meshToApertureUm(37).ok).toBe(false);
    expect(element.querySelector('.problems')?.textContent).toContain('No. 37 is not a sieve of the ASTM E11 series.');
  });
});
