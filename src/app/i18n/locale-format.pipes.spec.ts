import { TestBed } from '@angular/core/testing';
import { AppLanguage } from './app-language';
import { LocaleDatePipe, LocaleNumberPipe, LocalePercentPipe } from './locale-format.pipes';

describe('locale formatting pipes', () => {
  const make = <T>(pipe: new () => T) => TestBed.runInInjectionContext(() => new pipe());

  it('write numbers in the active language\'s conventions', async () => {
    const number = make(LocaleNumberPipe);
    expect(number.transform(12345.678, '1.1-1')).toBe('12,345.7');
    await TestBed.inject(AppLanguage).use('fr');
    // CLDR fr: decimal comma, narrow no-break space (U+202F) between thousands.
    expect(number.transform(12345.678, '1.1-1')).toBe('12\u202f345,7');
    await TestBed.inject(AppLanguage).use('sw');
    // CLDR sw: decimal point, comma between thousands.
    expect(number.transform(12345.678, '1.1-1')).toBe('12,345.7');
  });

  it('write percentages and dates per locale, and pass nothing through as nothing', async () => {
    const percent = make(LocalePercentPipe);
    const date = make(LocaleDatePipe);
    await TestBed.inject(AppLanguage).use('fr');
    expect(percent.transform(0.85)).toBe('85\u00a0%');
    expect(date.transform('2026-03-05T10:30:00Z', 'd MMMM y')).toBe('5 mars 2026');
    await TestBed.inject(AppLanguage).use('sw');
    expect(date.transform('2026-03-05T10:30:00Z', 'd MMMM y')).toBe('5 Machi 2026');
    expect(percent.transform(null)).toBeNull();
    expect(date.transform(undefined)).toBeNull();
    expect(make(LocaleNumberPipe).transform(Number.NaN)).toBeNull();
  });
});
