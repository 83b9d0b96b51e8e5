/**
 * A site's economic parameters for the shortlist (DESIGN §2 step 8, §7), in the numbers engine's
 * names. Money is in `currency`, the currency of the gold price; shares, recoveries and confidence
 * are fractions (0.3 = 30 %), never percent, as everywhere in the API.
 */
export interface EconomicParameters {
  readonly currency: string;
  readonly goldPricePerTroyOz: number;
  /** Fraction of the gold value the buyer pays. */
  readonly payableFraction: number;
  /** Load and haul, per tonne and road kilometre. */
  readonly haulCostPerTKm: number;
  /** Road distance ÷ straight-line distance. */
  readonly roadFactor: number;
  readonly processingCostPerT: number;
  readonly fixedCostPerPile: number;
  /** Owner's and crew's share of gross value. */
  readonly ownerShareOfGross: number;
  /** Confidence level of the grade interval whose lower bound gives the conservative value. */
  readonly confidenceLevel: number;
  /** Recovery used until the site has an accepted trial. */
  readonly defaultRecovery: number;
  /** Largest |weighed − formula| recovery a trial may show before it is flagged. */
  readonly discrepancyTolerance: number;
  /** Fewest counted samples a pile needs before it is ranked. */
  readonly minSamplesToRank: number;
}

/** The names of the parameters, in the order screens and reports list them. */
export const PARAMETER_NAMES = [
  'currency', 'goldPricePerTroyOz', 'payableFraction', 'haulCostPerTKm', 'roadFactor', 'processingCostPerT',
  'fixedCostPerPile', 'ownerShareOfGross', 'confidenceLevel', 'defaultRecovery', 'discrepancyTolerance', 'minSamplesToRank',
] as const satisfies readonly (keyof EconomicParameters)[];

/** One parameter's name. */
export type ParameterName = (typeof PARAMETER_NAMES)[number];
