import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { evaluateTrial, unwrap } from '../../../../../../shared/engine';
import { AuthSession, type SessionUser } from '../../../../core/auth/auth-session';
import { AppLanguage } from '../../../../i18n/app-language';
import { TrialsStore, type TrialList, type TrialView } from '../../trials.store';
import TrialsPage from './trials-page';

const manager: SessionUser = {
  id: 'm1', organizationId: 'o', email: 'amani@crew.test', name: 'Amani', role: 'manager', labName: null,
  siteIds: ['s1'], sites: [{ id: 's1', code: 'JR', name: 'Jackal Ridge' }], deviceId: 'd1', deviceName: 'Desk',
};

// The engine's own figures for a run whose tailings assay close to the feed: it warns that the recovery is uncertain.
const input = { feedGradeGpt: 2, concentrateGradeGpt: 40, tailingsGradeGpt: 1.6, feedMassKg: 1000, concentrateMassKg: 12.5 };
const figures = unwrap(evaluateTrial(input));
const trial: TrialView = {
  id: 't1', pileIds: ['p1'], pileCodes: ['JR-07-P0001'], trialDate: '2026-03-04', equipmentNote: 'Shaking table, deck 2',
  ...input, middlingsMassKg: null, middlingsGradeGpt: null, status: 'accepted',
  massYield: figures.massYield, recoveryTwoProduct: figures.recoveryTwoProduct, recoveryWeighed: figures.recoveryWeighed,
  discrepancy: figures.discrepancy, enrichmentRatio: figures.enrichmentRatio, recoverySd: figures.recoverySd,
  middlingsGoldFraction: null, isDiscrepancyOverTolerance: false, warnings: figures.warnings,
};
const list: TrialList = { items: [trial], workingRecovery: { recovery: 0.625, source: 'trials', trialCount: 1 }, discrepancyTolerance: 0.05 };

async function render() {
  TestBed.configureTestingModule({
    providers: [
      { provide: TrialsStore, useValue: { list: signal(list), piles: signal([]), problem: signal(null), isLoading: signal(false), load: jest.fn(async () => undefined) } },
    ],
  });
  TestBed.inject(AuthSession).signIn(manager, { accessToken: 'a', refreshToken: 'r' });
  const fixture = TestBed.createComponent(TrialsPage);
  fixture.autoDetectChanges();
  await fixture.whenStable();
  const element = fixture.nativeElement as HTMLElement;
  // The warning's words, without its icon's ligature name.
  const warningWords = () => element.querySelector('.warning')?.textContent?.replace(/^warning/, '');
  return { fixture, element, warningWords };
}

describe('TrialsPage', () => {
  it('shows the working recovery and the engine\'s warning in English', async () => {
    const { element, warningWords } = await render();
    expect(figures.warnings.map((warning) => warning.code)).toEqual(['recovery-uncertain']);
    expect(element.querySelector('.working')?.textContent).toContain('Working recovery 62.5 % from 1 accepted trial(s)');
    expect(warningWords()).toBe(figures.warnings[0].message);
  });

  it('speaks Kiswahili and French after a switch, with French decimals', async () => {
    const { fixture, element, warningWords } = await render();
    await TestBed.inject(AppLanguage).use('sw');
    await fixture.whenStable();
    expect(element.querySelector('h1')?.textContent).toContain('Majaribio');
    expect(element.querySelector('.working')?.textContent).toContain('Uopoaji wa kazi 62.5 % kutoka majaribio 1 yaliyokubaliwa');
    expect(warningWords()).toMatch(/^Uchambuzi wa mabaki uko karibu/);

    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();
    expect(element.querySelector('.working')?.textContent).toContain('Récupération de travail 62,5 % d’après 1 essai(s) accepté(s)');
    const recovery = (figures.recoveryTwoProduct * 100).toFixed(1).replace('.', ',');
    expect(warningWords()).toContain(`récupération ${recovery} % ±`);
    expect(element.querySelector('.status')?.textContent).toBe('accepté');
  });
});
