/**
 * Chart.js configurations of the QA/QC and calibration views, built from the API's data. Verdicts
 * are told by point shape as well as colour (circle pass, triangle warn, cross fail). The words
 * (legends, axis titles) come in through `ChartWords`, so a page rebuilds its charts in the active
 * language; chart.js formats the tick and tooltip numbers in `locale`.
 */
import { formatNumber } from '@angular/common';
import type { ChartConfiguration, PointStyle } from 'chart.js';
import type { QcVerdict, SiteCalibration, SiteQaqc } from './qaqc.store';

const SHAPES: Record<QcVerdict, PointStyle> = { pass: 'circle', warn: 'triangle', fail: 'crossRot', 'no-result': 'rect', 'unknown-standard': 'rectRot', 'no-qc': 'dash' };
const COLOURS: Record<QcVerdict, string> = { pass: '#1b6b3a', warn: '#8a5a00', fail: '#b3261e', 'no-result': '#555', 'unknown-standard': '#555', 'no-qc': '#555' };

/** The active language as the charts need it: a translate function and the CLDR locale for numbers. */
export interface ChartWords {
  readonly translate: (key: string, params?: Record<string, unknown>) => string;
  readonly locale: string;
}

/** Lines bounding HARD ≤ t around y = x: duplicate / original = (1 ± t)/(1 ∓ t) (Abzalov 2008). */
export function hardBounds(tolerance: number): { upper: number; lower: number } {
  return { upper: (1 + tolerance) / (1 - tolerance), lower: (1 - tolerance) / (1 + tolerance) };
}

/** Duplicate pairs: original on x, duplicate on y, with y = x and the HARD tolerance lines. */
export function duplicateChart(duplicates: SiteQaqc['duplicates'], words: ChartWords): ChartConfiguration {
  const pairs = duplicates.filter((pair) => pair.originalGpt !== null && pair.duplicateGpt !== null);
  const tolerance = pairs[0]?.tolerance ?? 0.3;
  const top = Math.max(0.01, ...pairs.flatMap((pair) => [pair.originalGpt as number, pair.duplicateGpt as number])) * 1.1;
  const { upper, lower } = hardBounds(tolerance);
  const line = (label: string, slope: number, dash: number[]) => ({ type: 'line' as const, label, data: [{ x: 0, y: 0 }, { x: top, y: top * slope }], borderColor: '#444', borderDash: dash, pointRadius: 0, borderWidth: 1 });
  return {
    type: 'scatter',
    data: {
      datasets: [
        { label: words.translate('qaqc.charts.pairs'), data: pairs.map((pair) => ({ x: pair.originalGpt as number, y: pair.duplicateGpt as number })),
          pointStyle: pairs.map((pair) => SHAPES[pair.verdict]), pointBackgroundColor: pairs.map((pair) => COLOURS[pair.verdict]), borderColor: pairs.map((pair) => COLOURS[pair.verdict]), pointRadius: 6 },
        line('y = x', 1, []),
        line(words.translate('qaqc.charts.hardUpper', { percent: Math.round(tolerance * 100) }), upper, [6, 4]),
        line(words.translate('qaqc.charts.hardLower', { percent: Math.round(tolerance * 100) }), lower, [6, 4]),
      ],
    },
    options: { locale: words.locale, scales: { x: { title: { display: true, text: words.translate('qaqc.charts.originalAxis') }, min: 0, max: top }, y: { title: { display: true, text: words.translate('qaqc.charts.duplicateAxis') }, min: 0, max: top * upper } } },
  };
}

/** A control chart of one standard: value by batch order, expected value and ±2/±3 SD lines. */
export function standardChart(code: string, entries: SiteQaqc['standards'], expectedGpt: number, sdGpt: number, words: ChartWords): ChartConfiguration {
  const points = entries.filter((entry) => entry.standardCode === code && entry.valueGpt !== null);
  const labels = points.map((entry) => `${entry.batchCode} ${entry.labCode.slice(-3)}`);
  const flat = (label: string, value: number, dash: number[], colour: string) => ({ type: 'line' as const, label, data: labels.map(() => value), borderColor: colour, borderDash: dash, pointRadius: 0, borderWidth: 1, fill: false });
  return {
    type: 'line',
    data: {
      labels,
      datasets: [
        { label: words.translate('qaqc.charts.standardResult', { code }), data: points.map((entry) => entry.valueGpt as number), showLine: true, borderColor: '#1f3b73',
          pointStyle: points.map((entry) => SHAPES[entry.verdict]), pointBackgroundColor: points.map((entry) => COLOURS[entry.verdict]), pointRadius: 6 },
        flat(words.translate('qaqc.charts.expected'), expectedGpt, [], '#1b6b3a'),
        flat(words.translate('qaqc.charts.plusSd', { n: 2 }), expectedGpt + 2 * sdGpt, [6, 4], '#8a5a00'), flat(words.translate('qaqc.charts.minusSd', { n: 2 }), expectedGpt - 2 * sdGpt, [6, 4], '#8a5a00'),
        flat(words.translate('qaqc.charts.plusSd', { n: 3 }), expectedGpt + 3 * sdGpt, [2, 2], '#b3261e'), flat(words.translate('qaqc.charts.minusSd', { n: 3 }), expectedGpt - 3 * sdGpt, [2, 2], '#b3261e'),
      ],
    },
    options: { locale: words.locale, scales: { y: { title: { display: true, text: words.translate('qaqc.charts.gradeAxis') } }, x: { title: { display: true, text: words.translate('qaqc.charts.batchOrderAxis') } } } },
  };
}

/** Blanks by batch order against their fail line (5 × detection limit). */
export function blankChart(blanks: SiteQaqc['blanks'], words: ChartWords): ChartConfiguration {
  const points = blanks.filter((entry) => entry.valueGpt !== null);
  const labels = points.map((entry) => `${entry.batchCode} ${entry.labCode.slice(-3)}`);
  return {
    type: 'line',
    data: {
      labels,
      datasets: [
        { label: words.translate('qaqc.charts.blankResult'), data: points.map((entry) => entry.valueGpt as number), showLine: true, borderColor: '#1f3b73',
          pointStyle: points.map((entry) => SHAPES[entry.verdict]), pointBackgroundColor: points.map((entry) => COLOURS[entry.verdict]), pointRadius: 6 },
        { label: words.translate('qaqc.charts.blankFailLine'), data: points.map((entry) => entry.limitGpt), borderColor: '#b3261e', borderDash: [6, 4], pointRadius: 0, borderWidth: 1 },
      ],
    },
    options: { locale: words.locale, scales: { y: { min: 0, title: { display: true, text: words.translate('qaqc.charts.gradeAxis') } } } },
  };
}

/** Pan estimate against assay with the fitted line over the pan range. */
export function calibrationChart(calibration: SiteCalibration, words: ChartWords): ChartConfiguration {
  const fit = calibration.fit;
  const top = Math.max(0.01, ...calibration.points.map((point) => point.panGpt)) * 1.05;
  const digits = (value: number) => formatNumber(value, words.locale, '1.3-3');
  return {
    type: 'scatter',
    data: {
      datasets: [
        { label: words.translate('qaqc.charts.calibrationSamples'), data: calibration.points.map((point) => ({ x: point.panGpt, y: point.assayGpt })), pointRadius: 5, backgroundColor: '#1f3b73' },
        ...(fit ? [{ type: 'line' as const, label: words.translate('qaqc.charts.fittedLine', { intercept: digits(fit.interceptGpt), slope: digits(fit.slope) }), data: [{ x: 0, y: fit.interceptGpt }, { x: top, y: fit.interceptGpt + fit.slope * top }], borderColor: '#b3261e', pointRadius: 0, borderWidth: 2 }] : []),
      ],
    },
    options: { locale: words.locale, scales: { x: { min: 0, title: { display: true, text: words.translate('qaqc.charts.panAxis') } }, y: { title: { display: true, text: words.translate('qaqc.charts.assayAxis') } } } },
  };
}
