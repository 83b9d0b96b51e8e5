/**
 * The shortlist: which piles are worth re-running, by net value (DESIGN §7).
 *   contained Au (g) = dry t × grade (g/t);  recoverable = contained × recovery
 *   gross = recoverable / 31.1034768 g per troy oz × price × payable fraction
 *   haul = dry t × (straight-line km from pile centroid to processing point × road factor) × cost per t·km
 *   net = gross − owner share of gross − haul − processing (per t) − fixed (per pile)
 *   break-even grade: the grade at which net = 0, costs being fixed by tonnes and distance
 *   conservative net: net at the grade's lower confidence bound
 * Ranks are by net value, best first; they are given again with the gold price and the recovery each
 * moved by ±20 %, so a manager sees which places are robust. Money is in the unit of the gold price.
 */
import { geodesicDistanceM, LonLat } from './footprint';
import { EngineError, Result, checkNumber, checkNumbers, engineError, fail, ok } from './result';
import { TROY_OUNCE_G } from './units';

/** Economic parameters of a site (all money in one currency, that of the gold price). */
export interface Economics {
  readonly goldPricePerTroyOz: number;
  /** Fraction of the gold value the buyer pays. */
  readonly payableFraction: number;
  readonly haulCostPerTKm: number;
  /** Road distance ÷ straight-line distance, ≥ 1. */
  readonly roadFactor: number;
  readonly processingPoint: LonLat;
  readonly processingCostPerT: number;
  readonly fixedCostPerPile: number;
  /** Owner's share of gross value, fraction. */
  readonly ownerShareOfGross: number;
  /** Plant recovery, fraction (from trials). */
  readonly recovery: number;
  /** Confidence level of the grade's lower bound, e.g. 0.9 (recorded; the bound comes with the pile). */
  readonly confidenceLevel: number;
}

/** What the shortlist needs of a pile. */
export interface ShortlistPile {
  readonly pileId: string;
  readonly code: string;
  readonly dryTonnes: number;
  readonly centroid: LonLat;
  /** Best estimate of grade, g/t. */
  readonly gradeGpt: number;
  /** Lower confidence bound of grade, g/t. */
  readonly gradeLowGpt: number;
}

/** The ranks of one pile under each scenario (1 = best). */
export interface ScenarioRanks {
  readonly base: number;
  readonly priceDown: number;
  readonly priceUp: number;
  readonly recoveryDown: number;
  readonly recoveryUp: number;
}

/** The economics of one pile. */
export interface ShortlistEntry {
  readonly pileId: string;
  readonly code: string;
  readonly dryTonnes: number;
  readonly gradeGpt: number;
  readonly gradeLowGpt: number;
  readonly containedAuG: number;
  readonly recoverableAuG: number;
  readonly grossValue: number;
  readonly haulDistanceKm: number;
  readonly haulCost: number;
  readonly processingCost: number;
  readonly fixedCost: number;
  readonly ownerShare: number;
  readonly netValue: number;
  readonly valuePerTonne: number;
  readonly breakEvenGradeGpt: number;
  readonly conservativeNetValue: number;
  readonly rank: number;
  readonly conservativeRank: number;
  readonly ranks: ScenarioRanks;
  /** Net value under each scenario, same keys as `ranks`. */
  readonly netValueByScenario: Readonly<Record<keyof ScenarioRanks, number>>;
}

/** The ranked shortlist with the assumptions it used. */
export interface Shortlist {
  readonly entries: readonly ShortlistEntry[];
  readonly assumptions: Economics & { readonly sensitivityStep: number; readonly notes: readonly string[] };
}

/** The step by which price and recovery are moved for the sensitivity ranks (DESIGN §7). */
export const SENSITIVITY_STEP = 0.2;

function validateEconomics(economics: Economics): EngineError[] {
  const errors = checkNumbers([
    ['goldPricePerTroyOz', economics?.goldPricePerTroyOz, 'positive'],
    ['payableFraction', economics?.payableFraction, 'open-fraction'],
    ['haulCostPerTKm', economics?.haulCostPerTKm, 'non-negative'],
    ['roadFactor', economics?.roadFactor, 'positive'],
    ['processingCostPerT', economics?.processingCostPerT, 'non-negative'],
    ['fixedCostPerPile', economics?.fixedCostPerPile, 'non-negative'],
    ['ownerShareOfGross', economics?.ownerShareOfGross, 'fraction'],
    ['recovery', economics?.recovery, 'open-fraction'],
    ['confidenceLevel', economics?.confidenceLevel, 'open-fraction'],
  ]);
  if (errors.length === 0 && economics.roadFactor < 1) {
    errors.push(engineError('out-of-range', 'roadFactor', `a road is never shorter than the straight line: roadFactor ≥ 1 (got ${economics.roadFactor})`));
  }
  if (errors.length === 0 && economics.ownerShareOfGross >= 1) {
    errors.push(engineError('out-of-range', 'ownerShareOfGross', 'an owner share of all the gross leaves nothing to rank'));
  }
  return errors;
}

interface Scenario {
  readonly price: number;
  readonly recovery: number;
}

function netAt(pile: ShortlistPile, gradeGpt: number, costs: number, economics: Economics, scenario: Scenario): number {
  const gross = ((pile.dryTonnes * gradeGpt * scenario.recovery) / TROY_OUNCE_G) * scenario.price * economics.payableFraction;
  return gross * (1 - economics.ownerShareOfGross) - costs;
}

function ranksOf(values: readonly number[], codes: readonly string[]): number[] {
  const order = values.map((_, index) => index).sort((a, b) => values[b] - values[a] || codes[a].localeCompare(codes[b]));
  const ranks = new Array<number>(values.length);
  order.forEach((index, position) => {
    ranks[index] = position + 1;
  });
  return ranks;
}

/** Economics and ranks of piles, with the sensitivity of the ranks to price and recovery (±20 %). */
export function buildShortlist(piles: readonly ShortlistPile[], economics: Economics): Result<Shortlist> {
  const errors = validateEconomics(economics);
  if (!Array.isArray(piles) || piles.length === 0) {
    errors.push(engineError('empty', 'piles', 'there are no piles to rank'));
  }
  const distancesKm: number[] = [];
  (Array.isArray(piles) ? piles : []).forEach((pile, index) => {
    errors.push(
      ...checkNumbers([
        [`piles[${index}].dryTonnes`, pile?.dryTonnes, 'non-negative'],
        [`piles[${index}].gradeGpt`, pile?.gradeGpt, 'non-negative'],
        [`piles[${index}].gradeLowGpt`, pile?.gradeLowGpt, 'non-negative'],
      ]),
    );
    const distance = geodesicDistanceM(pile?.centroid, economics?.processingPoint);
    if (distance.ok) {
      distancesKm.push(distance.value / 1000);
    } else {
      errors.push(...distance.errors.map((error) => ({ ...error, field: `piles[${index}].centroid or processingPoint` })));
    }
    const lowInvalid = checkNumber('gradeLowGpt', pile?.gradeLowGpt);
    if (!lowInvalid && pile.gradeLowGpt > pile.gradeGpt) {
      errors.push(engineError('out-of-range', `piles[${index}].gradeLowGpt`, 'the lower confidence bound cannot exceed the best estimate'));
    }
  });
  if (errors.length > 0) {
    return fail(...errors);
  }
  const scenarios: Readonly<Record<keyof ScenarioRanks, Scenario>> = {
    base: { price: economics.goldPricePerTroyOz, recovery: economics.recovery },
    priceDown: { price: economics.goldPricePerTroyOz * (1 - SENSITIVITY_STEP), recovery: economics.recovery },
    priceUp: { price: economics.goldPricePerTroyOz * (1 + SENSITIVITY_STEP), recovery: economics.recovery },
    recoveryDown: { price: economics.goldPricePerTroyOz, recovery: economics.recovery * (1 - SENSITIVITY_STEP) },
    // Recovery cannot pass 1, however good the trial.
    recoveryUp: { price: economics.goldPricePerTroyOz, recovery: Math.min(1, economics.recovery * (1 + SENSITIVITY_STEP)) },
  };
  const codes = piles.map((pile) => pile.code);
  const rows = piles.map((pile, index) => {
    const haulDistanceKm = distancesKm[index] * economics.roadFactor;
    const haulCost = pile.dryTonnes * haulDistanceKm * economics.haulCostPerTKm;
    const processingCost = pile.dryTonnes * economics.processingCostPerT;
    const fixedCost = economics.fixedCostPerPile;
    const costs = haulCost + processingCost + fixedCost;
    const containedAuG = pile.dryTonnes * pile.gradeGpt;
    const recoverableAuG = containedAuG * economics.recovery;
    const grossValue = (recoverableAuG / TROY_OUNCE_G) * economics.goldPricePerTroyOz * economics.payableFraction;
    const ownerShare = grossValue * economics.ownerShareOfGross;
    const netValue = grossValue - ownerShare - costs;
    const valuePerGradeUnit = (pile.dryTonnes * economics.recovery * economics.goldPricePerTroyOz * economics.payableFraction * (1 - economics.ownerShareOfGross)) / TROY_OUNCE_G;
    const netValueByScenario = Object.fromEntries(
      (Object.keys(scenarios) as (keyof ScenarioRanks)[]).map((key) => [key, netAt(pile, pile.gradeGpt, costs, economics, scenarios[key])]),
    ) as Record<keyof ScenarioRanks, number>;
    return {
      pileId: pile.pileId,
      code: pile.code,
      dryTonnes: pile.dryTonnes,
      gradeGpt: pile.gradeGpt,
      gradeLowGpt: pile.gradeLowGpt,
      containedAuG,
      recoverableAuG,
      grossValue,
      haulDistanceKm,
      haulCost,
      processingCost,
      fixedCost,
      ownerShare,
      netValue,
      valuePerTonne: pile.dryTonnes > 0 ? netValue / pile.dryTonnes : 0,
      // No tonnes: no grade pays for the fixed cost, so the break-even grade is unbounded.
      breakEvenGradeGpt: valuePerGradeUnit > 0 ? costs / valuePerGradeUnit : Infinity,
      conservativeNetValue: netAt(pile, pile.gradeLowGpt, costs, economics, scenarios.base),
      netValueByScenario,
    };
  });
  const rankBy = (key: keyof ScenarioRanks): number[] => ranksOf(rows.map((row) => row.netValueByScenario[key]), codes);
  const rankings = {
    base: rankBy('base'),
    priceDown: rankBy('priceDown'),
    priceUp: rankBy('priceUp'),
    recoveryDown: rankBy('recoveryDown'),
    recoveryUp: rankBy('recoveryUp'),
  };
  const conservativeRanks = ranksOf(rows.map((row) => row.conservativeNetValue), codes);
  const entries: ShortlistEntry[] = rows
    .map((row, index) => ({
      ...row,
      rank: rankings.base[index],
      conservativeRank: conservativeRanks[index],
      ranks: {
        base: rankings.base[index],
        priceDown: rankings.priceDown[index],
        priceUp: rankings.priceUp[index],
        recoveryDown: rankings.recoveryDown[index],
        recoveryUp: rankings.recoveryUp[index],
      },
    }))
    .sort((a, b) => a.rank - b.rank);
  return ok({
    entries,
    assumptions: {
      ...economics,
      sensitivityStep: SENSITIVITY_STEP,
      notes: [
        `troy ounce = ${TROY_OUNCE_G} g`,
        'haul distance = straight line from pile centroid to processing point × road factor',
        'owner share is taken from gross value',
        `conservative net value uses the lower bound of the grade's ${Math.round(economics.confidenceLevel * 100)} % confidence interval`,
        'recovery +20 % is capped at 1',
      ],
    },
  });
}
