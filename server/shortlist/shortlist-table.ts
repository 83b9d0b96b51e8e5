import type { ShortlistRow, ShortlistView } from './shortlist.service';

/** One column of the shortlist table, shared by the CSV and the PDF so they always agree. */
export interface ShortlistColumn {
  readonly header: string;
  readonly value: (row: ShortlistRow) => string | number | null;
  /** Decimal places when printed. */
  readonly digits?: number;
}

/** The columns of the shortlist table; money in the currency of the gold price. */
export function shortlistColumns(view: ShortlistView): readonly ShortlistColumn[] {
  const currency = view.parameters.currency;
  const step = Math.round(view.sensitivityStep * 100);
  return [
    { header: 'Rank', value: (row) => row.rank },
    { header: 'Pile', value: (row) => row.code },
    { header: 'Material', value: (row) => row.material },
    { header: 'Status', value: (row) => (row.isRankable ? 'ranked' : `not ranked: ${row.thinDataReasons.join('; ')}`) },
    { header: 'Graded samples', value: (row) => row.sampleCount },
    { header: 'Dry t', value: (row) => row.dryTonnes, digits: 1 },
    { header: 'Grade g/t (best)', value: (row) => row.gradeGpt, digits: 3 },
    { header: 'Grade g/t (conservative)', value: (row) => row.gradeLowGpt, digits: 3 },
    { header: 'Contained Au g', value: (row) => row.containedAuG, digits: 1 },
    { header: 'Recoverable Au g', value: (row) => row.recoverableAuG, digits: 1 },
    { header: `Gross ${currency}`, value: (row) => row.grossValue, digits: 0 },
    { header: 'Haul km (road)', value: (row) => row.haulDistanceKm, digits: 2 },
    { header: `Haul cost ${currency}`, value: (row) => row.haulCost, digits: 0 },
    { header: `Processing ${currency}`, value: (row) => row.processingCost, digits: 0 },
    { header: `Fixed ${currency}`, value: (row) => row.fixedCost, digits: 0 },
    { header: `Owner share ${currency}`, value: (row) => row.ownerShare, digits: 0 },
    { header: `Net ${currency}`, value: (row) => row.netValue, digits: 0 },
    { header: `Net per t ${currency}`, value: (row) => row.valuePerTonne, digits: 2 },
    { header: 'Break-even g/t', value: (row) => row.breakEvenGradeGpt, digits: 3 },
    { header: `Conservative net ${currency}`, value: (row) => row.conservativeNetValue, digits: 0 },
    { header: 'Conservative rank', value: (row) => row.conservativeRank },
    { header: `Rank price -${step} %`, value: (row) => row.ranks?.priceDown ?? null },
    { header: `Rank price +${step} %`, value: (row) => row.ranks?.priceUp ?? null },
    { header: `Rank recovery -${step} %`, value: (row) => row.ranks?.recoveryDown ?? null },
    { header: `Rank recovery +${step} %`, value: (row) => row.ranks?.recoveryUp ?? null },
  ];
}
