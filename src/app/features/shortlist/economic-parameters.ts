// A plain type with no Angular in it, so pure code (server-text.ts) and its tests in the server project can name it.

/** The economic parameters of a site, as `GET /api/economics/:siteId` answers (fractions, not percent). */
export interface EconomicParameters {
  readonly currency: string;
  readonly goldPricePerTroyOz: number;
  readonly payableFraction: number;
  readonly haulCostPerTKm: number;
  readonly roadFactor: number;
  readonly processingCostPerT: number;
  readonly fixedCostPerPile: number;
  readonly ownerShareOfGross: number;
  readonly confidenceLevel: number;
  readonly defaultRecovery: number;
  readonly discrepancyTolerance: number;
  readonly minSamplesToRank: number;
}
