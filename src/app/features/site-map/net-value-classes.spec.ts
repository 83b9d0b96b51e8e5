import { TestBed } from '@angular/core/testing';
import { TranslocoService } from '@jsverse/transloco';
import { LOSS_FILL, PAYING_FILLS, classOfNetValue, formatMoney, netValueClassLabel, netValueClasses, roundStep } from './net-value-classes';

describe('roundStep', () => {
  it.each([[0.7, 1], [1, 1], [1.2, 2], [2.1, 2.5], [3, 5], [7000, 10000], [4100, 5000], [0, 1]])('rounds %p up to %p', (value, step) => {
    expect(roundStep(value)).toBe(step);
  });
});

describe('netValueClasses', () => {
  it('puts losing piles in one class and splits paying piles into three classes of a round width', () => {
    const classes = netValueClasses([-800, 1200, 4000, 9000, 14500]);
    expect(classes.map((entry) => [entry.from, entry.upTo, entry.count, entry.fill])).toEqual([
      [null, 0, 1, LOSS_FILL],
      [0, 5000, 2, PAYING_FILLS[0]],
      [5000, 10000, 1, PAYING_FILLS[1]],
      [10000, null, 1, PAYING_FILLS[2]],
    ]);
  });

  it('leaves out classes no pile falls into, and gives nothing for no value', () => {
    expect(netValueClasses([100, 101]).map((entry) => [entry.from, entry.upTo])).toEqual([[100, null]]);
    expect(netValueClasses([])).toEqual([]);
  });

  it('counts a pile worth exactly nothing as paying, in the lowest class', () => {
    expect(classOfNetValue(0, netValueClasses([0, 3000]))?.from).toBe(0);
  });
});

describe('labels', () => {
  const translate = () => {
    const transloco = TestBed.inject(TranslocoService);
    return (key: string, params?: Record<string, unknown>) => transloco.translate(key, params);
  };

  it('says each class in whole money with the currency', () => {
    const [loss, low, , top] = netValueClasses([-1, 500, 1500, 3000]);
    expect(netValueClassLabel(loss, 'USD', translate())).toBe('loses money: below 0 USD');
    expect(netValueClassLabel(low, 'USD', translate())).toBe('0 USD – 1,000 USD');
    expect(netValueClassLabel(top, 'USD', translate())).toBe('2,000 USD and more');
    expect(formatMoney(-1249.6, 'TZS')).toBe('-1,250 TZS');
    expect(formatMoney(-0.4, 'TZS')).toBe('0 TZS');
  });

  it('says them in French with French digit grouping, and in Kiswahili', () => {
    const [loss, low, , top] = netValueClasses([-1, 500, 1500, 3000]);
    TestBed.inject(TranslocoService).setActiveLang('fr');
    // CLDR fr: a narrow no-break space (U+202F) between thousands.
    expect(formatMoney(-1249.6, 'TZS', 'fr')).toBe('-1\u202f250 TZS');
    expect(netValueClassLabel(top, 'USD', translate(), 'fr')).toBe('2\u202f000 USD et plus');
    expect(netValueClassLabel(loss, 'USD', translate(), 'fr')).toBe('perte\u00a0: moins de 0 USD');
    TestBed.inject(TranslocoService).setActiveLang('sw');
    expect(netValueClassLabel(low, 'USD', translate(), 'sw')).toBe('0 USD – 1,000 USD');
    expect(netValueClassLabel(top, 'USD', translate(), 'sw')).toBe('2,000 USD na zaidi');
  });
});
