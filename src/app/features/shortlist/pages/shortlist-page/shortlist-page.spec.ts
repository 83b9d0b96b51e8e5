import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { signal } from '@angular/core';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { AuthSession } from '../../../../core/auth/auth-session';
import { AppLanguage } from '../../../../i18n/app-language';
import { eventually } from '../../../../../testing/eventually';
import { assumption, thinDataReason, type ServerTextFormat } from '../../server-text';
import type { EconomicParameters, EconomicsView, ShortlistRow, ShortlistView } from '../../shortlist.store';
import ShortlistPage from './shortlist-page';

const SITE = { id: 'site-ee', code: 'EE', name: 'Eastern Edge test camp' };

const PARAMETERS: EconomicParameters = {
  currency: 'USD', goldPricePerTroyOz: 2000, payableFraction: 0.95, haulCostPerTKm: 0.5, roadFactor: 1.3, processingCostPerT: 20,
  fixedCostPerPile: 200, ownerShareOfGross: 0.25, confidenceLevel: 0.9, defaultRecovery: 0.6, discrepancyTolerance: 0.05, minSamplesToRank: 3,
};

const SCENARIO_VALUES = { base: 12345.6, priceDown: 9000, priceUp: 15000, recoveryDown: 9500, recoveryUp: 14000 };

const RANKED: ShortlistRow = {
  pileId: 'pile-1', code: 'EE-09-P0001', material: 'mill-discharge', isRankable: true, thinDataReasons: [], sampleCount: 5, gradeSource: 'assay',
  dryTonnes: 1234.4, gradeGpt: 1.25, gradeLowGpt: 0.8, centroid: { lon: 34.2, lat: -3.9 }, containedAuG: 1543, recoverableAuG: 925.8,
  grossValue: 56789, haulCost: 1200, processingCost: 24688, fixedCost: 200, ownerShare: 14197, netValue: 12345.6, valuePerTonne: 10.5,
  breakEvenGradeGpt: 0.62, conservativeNetValue: 4321, rank: 1, conservativeRank: 1,
  ranks: { base: 1, priceDown: 1, priceUp: 1, recoveryDown: 1, recoveryUp: 1 }, netValueByScenario: SCENARIO_VALUES,
};

const THIN: ShortlistRow = {
  ...RANKED, pileId: 'pile-2', code: 'EE-09-P0002', material: 'sluice-tailings', isRankable: false, sampleCount: 2, gradeSource: 'pan',
  thinDataReasons: ['too few samples: 2 graded, 3 needed to rank', 'a reason the screen has never seen'], dryTonnes: 88.2, gradeGpt: 0.55,
  containedAuG: null, recoverableAuG: null, grossValue: null, haulCost: null, processingCost: null, fixedCost: null, ownerShare: null, netValue: null,
  valuePerTonne: null, breakEvenGradeGpt: null, conservativeNetValue: null, rank: null, conservativeRank: null, ranks: null, netValueByScenario: null,
};

const VIEW: ShortlistView = {
  site: { ...SITE, processingPoint: { lon: 34.2, lat: -3.9 } }, generatedAt: '2026-03-01T08:00:00.000Z',
  parameters: { ...PARAMETERS, recovery: 0.6 }, sources: Object.fromEntries(Object.keys(PARAMETERS).map((name) => [name, 'site'])) as ShortlistView['sources'],
  recoverySource: 'default', acceptedTrialCount: 0, sensitivityStep: 0.2, rows: [RANKED, THIN],
  assumptions: ['recovery 60.0 %: stated default, no accepted trial yet', 'troy ounce = 31.1034768 g', 'roadFactor is the built-in default (1.3), not set for this site'],
};

const ECONOMICS: EconomicsView = {
  siteId: SITE.id, parameters: PARAMETERS, sources: VIEW.sources,
  history: [
    { id: 'change-1', parameter: 'goldPricePerTroyOz', oldValue: 2000, newValue: 1600, changedByName: 'Neema Mwakyusa', changedAt: '2026-03-01T08:00:00.000Z' },
    { id: 'change-2', parameter: 'payableFraction', oldValue: 0.95, newValue: 0.925, changedByName: 'Neema Mwakyusa', changedAt: '2026-03-01T08:00:00.000Z' },
  ],
};

async function settle(fixture: ComponentFixture<ShortlistPage>) {
  fixture.detectChanges();
  await fixture.whenStable();
  fixture.detectChanges();
}

async function render() {
  TestBed.configureTestingModule({
    providers: [
      provideHttpClient(), provideHttpClientTesting(),
      { provide: AuthSession, useValue: { user: signal({ id: 'user-m', sites: [SITE] }), role: signal('manager') } },
    ],
  });
  const fixture = TestBed.createComponent(ShortlistPage);
  fixture.autoDetectChanges();
  await fixture.whenStable();
  const http = TestBed.inject(HttpTestingController);
  http.expectOne((request) => request.url === '/api/shortlist' && request.params.get('site') === SITE.id).flush(VIEW);
  http.expectOne(`/api/economics/${SITE.id}`).flush(ECONOMICS);
  // The store sets both answers once its awaited pair resolves: wait for the list to show.
  await eventually(() => (fixture.nativeElement as HTMLElement).querySelector('li.pile'));
  await settle(fixture);
  return { fixture, element: fixture.nativeElement as HTMLElement, http };
}

const squash = (text: string | null | undefined) => (text ?? '').replace(/[ \n\t]+/g, ' ').trim();
/** What a person reads in a node: its text without the icon ligatures. */
function words(node: Element | null | undefined): string {
  if (!node) return '';
  const copy = node.cloneNode(true) as Element;
  copy.querySelectorAll('mat-icon').forEach((icon) => icon.remove());
  return squash(copy.textContent);
}
const text = (element: HTMLElement, selector: string) => words(element.querySelector(selector));
const all = (element: HTMLElement, selector: string) => [...element.querySelectorAll(selector)].map(words);
/** The `dd` beside the `dt` holding `term`, in the pile with this code. */
const figure = (element: HTMLElement, code: string, term: string) =>
  squash([...element.querySelectorAll(`li.pile[data-pile="${code}"] dl > div`)].find((pair) => squash(pair.querySelector('dt')?.textContent) === term)?.querySelector('dd')?.textContent);

describe('ShortlistPage', () => {
  // jsdom draws no canvas: the chart stays empty and the page shows the rank table.
  beforeEach(() => jest.spyOn(HTMLCanvasElement.prototype, 'getContext').mockReturnValue(null));
  afterEach(() => {
    TestBed.inject(HttpTestingController).verify();
    jest.restoreAllMocks();
  });

  it('speaks English, with the figures as the e2e story and the field crew read them', async () => {
    const { element } = await render();

    expect(text(element, 'h1')).toBe('Shortlist');
    expect(text(element, '.summary')).toBe('Gold 2,000 USD/troy oz · recovery 60.0% (stated default, no accepted trial)');
    expect(figure(element, 'EE-09-P0001', 'Net value')).toBe('12,346 USD');
    expect(figure(element, 'EE-09-P0001', 'Grade best / conservative')).toBe('1.25 / 0.80 g/t (5 samples, assay)');
    expect(figure(element, 'EE-09-P0001', 'Dry tonnes')).toBe('1,234 t');
    expect(text(element, 'li.pile[data-pile="EE-09-P0002"] .reasons')).toBe(
      'Data too thin to rank: too few samples: 2 graded, 3 needed to rank; a reason the screen has never seen.');
    expect(all(element, '.history li')).toEqual([
      expect.stringContaining('Gold price per troy ounce 2000 → 1600'),
      expect.stringContaining('Payable by the buyer (%) 95% → 92.5%'),
    ]);
    expect(all(element, 'section[aria-labelledby="assumptions-title"] li')).toEqual([
      'recovery 60%: stated default, no accepted trial yet',
      'troy ounce = 31.1 g',
      'Road factor (road ÷ straight line) is the built-in default (1.3), not set for this site',
    ]);
    expect(all(element, 'hs-sensitivity-chart thead th')).toEqual(['Pile', 'Price −20%', 'Recovery −20%', 'As set', 'Recovery +20%', 'Price +20%']);
    expect(element.querySelector('mat-select')?.getAttribute('aria-label')).toBe('Site');
    expect(element.querySelector('.safety h2')?.textContent).toContain('Before anyone moves a pile');
    expect(all(element, '.statement span')).toEqual([expect.stringContaining('not a resource statement'), expect.stringContaining('not a resource statement')]);
  });

  it('speaks French, with decimal commas, narrow-space thousands, metric units and the money in its own currency', async () => {
    const { fixture, element } = await render();
    await TestBed.inject(AppLanguage).use('fr');
    await settle(fixture);

    expect(text(element, 'h1')).toBe('Présélection');
    expect(text(element, '.summary')).toBe('Or 2\u202f000 USD/once troy · récupération 60,0\u00a0% (valeur par défaut déclarée, aucun essai accepté)');
    expect(figure(element, 'EE-09-P0001', 'Valeur nette')).toBe('12\u202f346 USD');
    expect(figure(element, 'EE-09-P0001', 'Teneur probable / prudente')).toBe('1,25 / 0,80 g/t (5 échantillons, analyse)');
    expect(figure(element, 'EE-09-P0001', 'Par tonne')).toBe('10,50 USD/t');
    expect(figure(element, 'EE-09-P0001', 'Teneur au seuil de rentabilité')).toBe('0,62 g/t');
    expect(text(element, 'li.pile[data-pile="EE-09-P0002"] .reasons')).toBe(
      'Données trop minces pour classer\u00a0: trop peu d’échantillons\u00a0: 2 avec teneur, 3 nécessaires pour classer; a reason the screen has never seen.');
    expect(text(element, 'li.pile[data-pile="EE-09-P0002"] .hs-muted:not(header *)')).toBe('88 t sèches · 0,55 g/t d’après 2 échantillon(s)');
    expect(all(element, '.history li')).toEqual([
      expect.stringContaining('Prix de l’or par once troy 2000 → 1600'),
      expect.stringContaining('Payé par l’acheteur (%) 95\u00a0% → 92,5\u00a0%'),
    ]);
    expect(all(element, 'section[aria-labelledby="assumptions-title"] li')).toEqual([
      'récupération 60\u00a0%\u00a0: valeur par défaut déclarée, pas encore d’essai accepté',
      'once troy = 31,1 g',
      'Facteur de route (route ÷ ligne droite)\u00a0: valeur intégrée par défaut (1,3), pas fixée pour ce site',
    ]);
    expect(all(element, 'hs-sensitivity-chart thead th')).toEqual(['Tas', 'Prix −20\u00a0%', 'Récupération −20\u00a0%', 'Tel que fixé', 'Récupération +20\u00a0%', 'Prix +20\u00a0%']);
    expect(element.querySelector('mat-select')?.getAttribute('aria-label')).toBe('Site');
    expect(element.querySelector('.safety h2')?.textContent).toContain('Avant que quiconque déplace un tas');
    expect(all(element, 'hs-caution-card h3')).toContain('Les vieux résidus peuvent contenir du mercure');
    expect(text(element, '.statement span')).toContain('pas une déclaration de ressources');
    expect(element.querySelector('input[name="goldPricePerTroyOz"]')?.closest('mat-form-field')?.textContent).toContain('Prix de l’or par once troy');
  });

  it('says in French why nothing was saved when no parameter changed', async () => {
    const { fixture, element } = await render();
    await TestBed.inject(AppLanguage).use('fr');
    await settle(fixture);

    (element.querySelector('form button[type="submit"]') as HTMLButtonElement).click();
    await settle(fixture);
    expect(text(element, 'form [role="alert"]')).toBe('Rien n’a changé.');
  });
});

describe('the server sentences on the shortlist', () => {
  const format: ServerTextFormat = { number: (value) => `n${value}`, percent: (value) => `p${value}`, field: (name) => `f:${name}` };

  it('recognises each known shape with its figures, and keeps an unknown sentence as written', () => {
    expect(thinDataReason('too few samples: 2 graded, 3 needed to rank', format)).toEqual({ key: 'shortlist.reasons.tooFewSamples', params: { graded: 'n2', needed: 'n3' } });
    expect(thinDataReason('no tonnage: the footprint crosses itself', format)).toEqual({ key: 'shortlist.reasons.noTonnageBecause', params: { detail: 'the footprint crosses itself' } });
    expect(thinDataReason('no tonnage', format)).toEqual({ key: 'shortlist.reasons.noTonnage', params: {} });
    expect(thinDataReason('something new', format)).toEqual({ text: 'something new' });
    expect(assumption('recovery 72.5 %: feed-mass-weighted two-product recovery of 3 accepted trial(s)', format))
      .toEqual({ key: 'shortlist.assumptions.recoveryTrials', params: { recovery: 'p0.725', count: 'n3' } });
    expect(assumption('recovery +20 % is capped at 1', format)).toEqual({ key: 'shortlist.assumptions.recoveryCap', params: { step: 'p0.2' } });
    expect(assumption('currency is the built-in default (USD), not set for this site', format))
      .toEqual({ key: 'shortlist.assumptions.builtIn', params: { field: 'f:currency', value: 'USD' } });
    // A parameter the screen has no label for: the sentence stays whole rather than half-translated.
    expect(assumption('newThing is the built-in default (4), not set for this site', format)).toEqual({ text: 'newThing is the built-in default (4), not set for this site' });
  });
});
