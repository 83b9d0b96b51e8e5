import { TestBed } from '@angular/core/testing';
import { minimumSampleMass, samplingErrorForMass, unwrap } from '../../../../../shared/engine';
import { AppLanguage } from '../../../i18n/app-language';
import { SampleMassHint } from './sample-mass-hint';

async function render(inputs: Record<string, unknown>) {
  const fixture = TestBed.createComponent(SampleMassHint);
  for (const [name, value] of Object.entries(inputs)) {
    fixture.componentRef.setInput(name, value);
  }
  fixture.detectChanges();
  await fixture.whenStable();
  return fixture.nativeElement as HTMLElement;
}

describe('SampleMassHint', () => {
  it('warns with the minimum mass when a coarse gold sample is far too small', async () => {
    const element = await render({ massKg: 0.5, topSizeMm: 10, liberationSizeMm: 0.1, gradeGpt: 1 });
    expect(element.textContent).toContain('Gy');
    expect(element.textContent).toMatch(/at least\s+[\d,.]+ kg/);
  });

  it('says the whole hint with the engine\'s numbers in English', async () => {
    const material = { topSizeMm: 10, liberationSizeMm: 0.1, gradeGpt: 1 };
    const minimum = unwrap(minimumSampleMass({ ...material, targetRelativeSd: 0.1 })).minimumMassKg;
    const error = unwrap(samplingErrorForMass({ ...material, sampleMassKg: 0.5 })).relativeSd;

    const element = await render({ massKg: 0.5, ...material });

    const en = (value: number, digits: number) => value.toLocaleString('en', { maximumFractionDigits: digits });
    expect(element.querySelector('p')?.textContent?.replace(/\s+/g, ' ').trim()).toBe(
      `This sample is 0.5 kg. For a fundamental error of ±10 % (1 SD) at 10 mm top size, Gy's formula asks for at least ${en(minimum, 2)} kg; as taken it carries about ±${en(error * 100, 0)} %.`,
    );
    expect(element.querySelector('strong')?.textContent).toBe(`at least ${en(minimum, 2)} kg`);
  });

  it('speaks French with French decimals after a switch', async () => {
    const material = { topSizeMm: 0.8, liberationSizeMm: 0.1, gradeGpt: 1 };
    const minimum = unwrap(minimumSampleMass({ ...material, targetRelativeSd: 0.1 })).minimumMassKg;
    await TestBed.inject(AppLanguage).use('fr');

    const element = await render({ massKg: 0.25, ...material });

    const fr = (value: number) => value.toLocaleString('fr', { maximumFractionDigits: 2 }).replace(/\s/g, '\u202f');
    expect(element.textContent).toContain('Cet échantillon pèse 0,25 kg.');
    expect(element.textContent).toContain('à une taille maximale de 0,8 mm, la formule de Gy demande');
    expect(element.querySelector('strong')?.textContent).toBe(`au moins ${fr(minimum)} kg`);
    expect(element.querySelector('p')?.textContent?.trim()).toMatch(/kg\u202f; tel qu’il a été pris, il porte une erreur d’environ ±\d+ %\.$/);
  });

  it('says nothing while the material is not described', async () => {
    const element = await render({ massKg: 0.5, topSizeMm: null, liberationSizeMm: 0.1, gradeGpt: 1 });
    expect(element.textContent?.trim()).toBe('');
  });

  it('says nothing when the sample is heavy enough', async () => {
    const element = await render({ massKg: 1000, topSizeMm: 0.1, liberationSizeMm: 0.1, gradeGpt: 5 });
    expect(element.textContent?.trim()).toBe('');
  });
});
