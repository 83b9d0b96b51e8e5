import { z } from 'zod';
import { PARAMETER_NAMES, type EconomicParameters, type ParameterName } from '../../shared/economics/economic-parameters';
import type { SiteEconomics } from '../sites/site-economics';

// The parameters' names and types are shared with the Shortlist screen.
export { PARAMETER_NAMES, type EconomicParameters, type ParameterName };

/**
 * Values used when neither the manager nor the site's defaults set a parameter. They are invented
 * starting points (common practice, no source), shown as "default" beside every figure until the
 * manager sets the site's own: the gold price especially must be set to the day's price.
 */
export const BUILT_IN_ECONOMICS: EconomicParameters = {
  currency: 'USD',
  // An invented round figure, not a quoted market price.
  goldPricePerTroyOz: 2400,
  payableFraction: 0.95,
  haulCostPerTKm: 0.6,
  roadFactor: 1.3,
  processingCostPerT: 12,
  fixedCostPerPile: 250,
  ownerShareOfGross: 0.3,
  // 90 %: the grade statistics' own default confidence level.
  confidenceLevel: 0.9,
  // A shaking table on fine free gold; to be replaced by the site's trials.
  defaultRecovery: 0.5,
  // Five percentage points between weighed and assay-based recovery.
  discrepancyTolerance: 0.05,
  // Below five grades the spread, and so the conservative value, means little.
  minSamplesToRank: 5,
};

/** Rules for each parameter, with messages a manager can act on. `coerce` reads query strings. */
function parameterRules(coerce: boolean) {
  const number = () => (coerce ? z.coerce.number({ error: 'must be a number' }) : z.number({ error: 'must be a number' }));
  const notNegative = (what: string) => number().min(0, `${what} must not be negative`).max(1_000_000_000, `${what} is implausibly large`);
  return {
    currency: z.string().regex(/^[A-Z]{3}$/, 'the currency is a three-letter code such as USD (ISO 4217)'),
    goldPricePerTroyOz: number().gt(0, 'the gold price must be above zero').max(1_000_000, 'the gold price per troy ounce is implausibly large'),
    payableFraction: number().gt(0, 'the payable fraction must be above 0 %').max(1, 'the payable fraction cannot be over 100 %'),
    haulCostPerTKm: notNegative('the haul cost'),
    roadFactor: number().min(1, 'a road is never shorter than the straight line: road factor at least 1').max(5, 'a road factor above 5 is implausible'),
    processingCostPerT: notNegative('the processing cost'),
    fixedCostPerPile: notNegative('the fixed cost per pile'),
    ownerShareOfGross: number().min(0, 'the owner share must not be negative').max(1, 'the owner share cannot be over 100 %')
      .lt(1, 'an owner share of 100 % leaves nothing to rank'),
    confidenceLevel: number().min(0.5, 'the confidence level must be at least 50 %').max(0.99, 'the confidence level must be at most 99 %'),
    defaultRecovery: number().gt(0, 'the default recovery must be above 0 %').max(1, 'a recovery cannot be over 100 %'),
    discrepancyTolerance: number().min(0, 'the tolerance must not be negative').max(0.5, 'a tolerance over 50 % would flag nothing'),
    minSamplesToRank: number().int('the fewest samples is a whole number').min(2, 'a pile needs at least 2 samples for a spread').max(1000, 'at most 1000 samples'),
  };
}

/** A complete set of parameters, as stored. */
export const economicParametersSchema = z.strictObject(parameterRules(false));

/** A change the manager makes: any parameters, at least one. */
export const economicsChangeSchema = economicParametersSchema
  .partial()
  .refine((changes) => Object.keys(changes).length > 0, 'name at least one parameter to change');

/** What-if overrides a shortlist query may carry: any parameter, and the recovery itself. */
export const economicsOverridesSchema = z.strictObject({
  ...parameterRules(true),
  recovery: z.coerce.number({ error: 'must be a number' }).gt(0, 'the recovery must be above 0 %').max(1, 'a recovery cannot be over 100 %'),
}).partial();

/** Query overrides of the shortlist. */
export type EconomicsOverrides = z.infer<typeof economicsOverridesSchema>;

/** Where a parameter's value came from. */
export type ParameterSource = 'site' | 'site-default' | 'built-in' | 'query';

/** The site defaults an admin may have stored on the site record, in this module's names. */
export function fromSiteDefaults(defaults: SiteEconomics | null): Partial<EconomicParameters> {
  if (!defaults) {
    return {};
  }
  const mapped: Partial<Record<ParameterName, unknown>> = {
    currency: defaults.currency,
    goldPricePerTroyOz: defaults.goldPricePerTroyOz,
    haulCostPerTKm: defaults.haulCostPerTonneKm,
    roadFactor: defaults.roadFactor,
    processingCostPerT: defaults.processingCostPerTonne,
    fixedCostPerPile: defaults.fixedCostPerPile,
    ownerShareOfGross: defaults.ownerShareFraction,
    defaultRecovery: defaults.recoveryFraction,
  };
  const kept = Object.entries(mapped).filter(([, value]) => value !== undefined);
  const parsed = economicParametersSchema.partial().safeParse(Object.fromEntries(kept));
  return parsed.success ? parsed.data : {};
}
