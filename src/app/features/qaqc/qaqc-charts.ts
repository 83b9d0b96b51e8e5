/**
 * Chart.js configurations of the QA/QC and calibration views, built from the API's data. Verdicts
 * are told by point shape as well as colour (circle pass, triangle warn, cross fail).
 */
import type { ChartConfiguration, PointStyle } from 'chart.js';
import type { QcVerdict, SiteCalibration, SiteQaqc } from './qaqc.store';

const SHAPES: Record<QcVerdict, PointStyle> = { pass: 'circle', warn: 'triangle', fail: 'crossRot', 'no-result': 'rect', 'unknown-standard': 'rectRot', 'no-qc': 'dash' };
const COLOURS: Record<QcVerdict, string> = { pass: '#1b6b3a', warn: '#8a5a00', fail: '#b3261e', 'no-result': '#555', 'unknown-standard': '#555', 'no-qc': '#555' };

/** Lines bounding HARD ≤ t around y = x: duplicate / original = (1 ± t)/(1 ∓ t) (Abzalov 2008). */
export function hardBounds(tolerance: number): { upper: number; lower: number } {
  return { upper: (1 + tolerance) / (1 - tolerance), lower: (1 - tolerance) / (1 + tolerance) };
}

/** Duplicate pairs: original on x, duplicate on y, with y = x and the HARD tolerance lines. */
export function duplicateChart(duplicates: SiteQaqc['duplicates']): ChartConfiguration {
  const pairs = duplicates.filter((pair) => pair.originalGpt !== null && pair.duplicateGpt !== null);
  const tolerance = pairs[0]?.tolerance ?? 0.3;
  const top = Math.max(0.01, ...pairs.flatMap((pair) => [pair.originalGpt as number, pair.duplicateGpt as number])) * 1.1;
  const { upper, lower } = hardBounds(tolerance);
  const line = (label: string, slope: number, dash: number[]) => ({ type: 'line' as const, label, data: [{ x: 0, y: 0 }, { x: top, y: top * slope }], borderColor: '#444', borderDash: dash, pointRadius: 0, borderWidth: 1 });
  return {
    type: 'scatter',
    data: {
      datasets: [
        { label: 'Pairs', data: pairs.map((pair) => ({ x: pair.originalGpt as number, y: pair.duplicateGpt as number })),
          pointStyle: pairs.map((pair) => SHAPES[pair.verdict]), pointBackgroundColor: pairs.map((pair) => COLOURS[pair.verdict]), borderColor: pairs.map((pair) => COLOURS[pair.verdict]), pointRadius: 6 },
        line('y = x', 1, []),
        line(`HARD ${Math.round(tolerance * 100)} % (upper)`, upper, [6, 4]),
        line(`HARD ${Math.round(tolerance * 100)} % (lower)`, lower, [6, 4]),
      ],
    },
    options: { scales: { x: { title: { display: true, text: 'Original Au g/t' }, min: 0, max: top }, y: { title: { display: true, text: 'Duplicate Au g/t' }, min: 0, max: top * upper } } },
  };
}

/** A control chart of one standard: value by batch order, expected value and ±2/±3 SD lines. */
export function standardChart(code: string, entries: SiteQaqc['standards'], expectedGpt: number, sdGpt: number): ChartConfiguration {
  const points = entries.filter((entry) => entry.standardCode === code && entry.valueGpt !== null);
  const labels = points.map((entry) => `${entry.batchCode} ${entry.labCode.slice(-3)}`);
  const flat = (label: string, value: number, dash: number[], colour: string) => ({ type: 'line' as const, label, data: labels.map(() => value), borderColor: colour, borderDash: dash, pointRadius: 0, borderWidth: 1, fill: false });
  return {
    type: 'line',
    data: {
      labels,
      datasets: [
        { label: `${code} result`, data: points.map((entry) => entry.valueGpt as number), showLine: true, borderColor: '#1f3b73',
          pointStyle: points.map((entry) => SHAPES[entry.verdict]), pointBackgroundColor: points.map((entry) => COLOURS[entry.verdict]), pointRadius: 6 },
        flat('Expected', expectedGpt, [], '#1b6b3a'),
        flat('+2 SD', expectedGpt + 2 * sdGpt, [6, 4], '#8a5a00'), flat('−2 SD', expectedGpt - 2 * sdGpt, [6, 4], '#8a5a00'),
        flat('+3 SD', expectedGpt + 3 * sdGpt, [2, 2], '#b3261e'), flat('−3 SD', expectedGpt - 3 * sdGpt, [2, 2], '#b3261e'),
      ],
    },
    options: { scales: { y: { title: { display: true, text: 'Au g/t' } }, x: { title: { display: true, text: 'Batch order' } } } },
  };
}

/** Blanks by batch order against their fail line (5 × detection limit). */
export function blankChart(blanks: SiteQaqc['blanks']): ChartConfiguration {
  const points = blanks.filter((entry) => entry.valueGpt !== null);
  const labels = points.map((entry) => `${entry.batchCode} ${entry.labCode.slice(-3)}`);
  return {
    type: 'line',
    data: {
      labels,
      datasets: [
        { label: 'Blank result (below detection at the limit)', data: points.map((entry) => entry.valueGpt as number), showLine: true, borderColor: '#1f3b73',
          pointStyle: points.map((entry) => SHAPES[entry.verdict]), pointBackgroundColor: points.map((entry) => COLOURS[entry.verdict]), pointRadius: 6 },
        { label: 'Fail above (5 × detection limit)', data: points.map((entry) => entry.limitGpt), borderColor: '#b3261e', borderDash: [6, 4], pointRadius: 0, borderWidth: 1 },
      ],
    },
    options: { scales: { y: { min: 0, title: { display: true, text: 'Au g/t' } } } },
  };
}

/** Pan estimate against assay with the fitted line over the pan range. */
export function calibrationChart(calibration: SiteCalibration): ChartConfiguration {
  const fit = calibration.fit;
  const top = Math.max(0.01, ...calibration.points.map((point) => point.panGpt)) * 1.05;
  return {
    type: 'scatter',
    data: {
      datasets: [
        { label: 'Samples (pan, assay)', data: calibration.points.map((point) => ({ x: point.panGpt, y: point.assayGpt })), pointRadius: 5, backgroundColor: '#1f3b73' },
        ...(fit ? [{ type: 'line' as const, label: `Fitted: assay = ${fit.interceptGpt.toFixed(3)} + ${fit.slope.toFixed(3)} × pan`, data: [{ x: 0, y: fit.interceptGpt }, { x: top, y: fit.interceptGpt + fit.slope * top }], borderColor: '#b3261e', pointRadius: 0, borderWidth: 2 }] : []),
      ],
    },
    options: { scales: { x: { min: 0, title: { display: true, text: 'Pan estimate g/t' } }, y: { title: { display: true, text: 'Assay Au g/t' } } } },
  };
}
