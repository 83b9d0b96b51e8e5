/**
 * Classes of net value for shading piles on the site map. The values are the shortlist's (the
 * engine's `buildShortlist` on the server); this only groups them: one class for piles that lose
 * money, and up to three equal classes of round width for those that pay, so a legend reads in
 * whole amounts of the site's currency ("0 – 5,000 USD").
 */
import { formatNumber } from '@angular/common';

/** Translates a key with parameters (TranslocoService.translate). */
export type Translate = (key: string, params?: Record<string, unknown>) => string;

/** One class: its bounds (`upTo` null for the open top class), fill colour and how many piles fall in it. */
export interface NetValueClass {
  readonly from: number | null;
  readonly upTo: number | null;
  readonly fill: string;
  readonly isLoss: boolean;
  readonly count: number;
}

/** Fill for piles that lose money: a warm sand, far from the paying blues in hue and lightness. */
export const LOSS_FILL = '#e8b27d';
/** Fills of the paying classes, light (least) to dark (most): lightness alone orders them, also in greyscale. */
export const PAYING_FILLS = ['#cfe3f2', '#6fa6cf', '#1f5f91'] as const;

/** The smallest of 1, 2, 2.5 or 5 × 10^k that is at least `value` (a width a reader can add up). */
export function roundStep(value: number): number {
  if (!(value > 0)) {
    return 1;
  }
  const power = 10 ** Math.floor(Math.log10(value));
  const factor = [1, 2, 2.5, 5, 10].find((candidate) => candidate * power >= value * (1 - 1e-12)) ?? 10;
  return factor * power;
}

/** The classes the given net values fall into (classes with no pile are left out). */
export function netValueClasses(values: readonly number[]): NetValueClass[] {
  const finite = values.filter((value) => Number.isFinite(value));
  const losses = finite.filter((value) => value < 0);
  const paying = finite.filter((value) => value >= 0);
  const classes: NetValueClass[] = [];
  if (losses.length > 0) {
    classes.push({ from: null, upTo: 0, fill: LOSS_FILL, isLoss: true, count: losses.length });
  }
  if (paying.length > 0) {
    const step = roundStep(Math.max(...paying) / PAYING_FILLS.length);
    PAYING_FILLS.forEach((fill, index) => {
      const from = index * step;
      const upTo = index === PAYING_FILLS.length - 1 ? null : (index + 1) * step;
      const count = paying.filter((value) => value >= from && (upTo === null || value < upTo)).length;
      if (count > 0) {
        classes.push({ from, upTo, fill, isLoss: false, count });
      }
    });
  }
  return classes;
}

/** The class a value falls into, or null (not among the classes). */
export function classOfNetValue(value: number, classes: readonly NetValueClass[]): NetValueClass | null {
  return classes.find((entry) => (entry.from === null || value >= entry.from) && (entry.upTo === null || value < entry.upTo)) ?? null;
}

/**
 * A whole amount of money with the locale's thousands separators and the currency code, e.g.
 * "-1,250 USD" in English, "-1 250 USD" in French.
 */
export function formatMoney(value: number, currency: string, locale = 'en'): string {
  // `|| 0`: a rounded -0.4 is no loss, so no minus sign.
  return `${formatNumber(Math.round(value) || 0, locale, '1.0-0')} ${currency}`;
}

/** The legend words of a class, in money, in the reader's language. */
export function netValueClassLabel(entry: NetValueClass, currency: string, translate: Translate, locale = 'en'): string {
  if (entry.isLoss) {
    return translate('siteMap.netValue.loss', { amount: formatMoney(0, currency, locale) });
  }
  const from = formatMoney(entry.from ?? 0, currency, locale);
  return entry.upTo === null
    ? translate('siteMap.netValue.andMore', { from })
    : translate('siteMap.netValue.between', { from, upTo: formatMoney(entry.upTo, currency, locale) });
}
