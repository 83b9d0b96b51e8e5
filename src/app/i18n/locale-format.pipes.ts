import { formatDate, formatNumber, formatPercent } from '@angular/common';
import { Pipe, PipeTransform, inject } from '@angular/core';
import { AppLanguage } from './app-language';

/*
 * Numbers and dates in the active language's conventions (1 234,5 in French, 1,234.5 in English),
 * switching with the language at run time. Angular's own `number` and `date` pipes fix the locale at
 * start-up, so these take the same digit and date formats but read the locale from a signal; being
 * impure, they re-run with the template, and the signal read makes a language switch re-render it.
 */

@Pipe({ name: 'hsNumber', pure: false })
export class LocaleNumberPipe implements PipeTransform {
  private readonly language = inject(AppLanguage);

  transform(value: number | null | undefined, digitsInfo?: string): string | null {
    if (value === null || value === undefined || Number.isNaN(value)) return null;
    return formatNumber(value, this.language.locale(), digitsInfo);
  }
}

@Pipe({ name: 'hsPercent', pure: false })
export class LocalePercentPipe implements PipeTransform {
  private readonly language = inject(AppLanguage);

  transform(value: number | null | undefined, digitsInfo?: string): string | null {
    if (value === null || value === undefined || Number.isNaN(value)) return null;
    return formatPercent(value, this.language.locale(), digitsInfo);
  }
}

@Pipe({ name: 'hsDate', pure: false })
export class LocaleDatePipe implements PipeTransform {
  private readonly language = inject(AppLanguage);

  transform(value: string | number | Date | null | undefined, format = 'mediumDate'): string | null {
    if (value === null || value === undefined || value === '') return null;
    return formatDate(value, format, this.language.locale());
  }
}

/** The template pieces most screens need: import this array into a component's `imports`. */
export const LOCALE_FORMAT_PIPES = [LocaleNumberPipe, LocalePercentPipe, LocaleDatePipe] as const;
