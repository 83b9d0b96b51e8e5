import { z } from 'zod';

/**
 * A site's default economic parameters for the shortlist; each may be overridden per query.
 * Money is in the site's own currency; fractions are 0–1, not percent. Absent values fall back
 * to the shortlist's own defaults.
 */
export const siteEconomicsSchema = z.strictObject({
  currency: z.string().regex(/^[A-Z]{3}$/, 'A three-letter currency code (ISO 4217)').optional(),
  goldPricePerTroyOz: z.number().positive().max(1_000_000).optional(),
  recoveryFraction: z.number().min(0).max(1).optional(),
  haulCostPerTonneKm: z.number().min(0).max(100_000).optional(),
  roadFactor: z.number().min(1).max(5).optional(),
  processingCostPerTonne: z.number().min(0).max(1_000_000).optional(),
  fixedCostPerPile: z.number().min(0).max(100_000_000).optional(),
  ownerShareFraction: z.number().min(0).max(1).optional(),
});

/** The economic parameters a site may carry. */
export type SiteEconomics = z.infer<typeof siteEconomicsSchema>;

/** Reads the stored JSON back; a damaged value reads as none rather than breaking the site. */
export function readEconomics(stored: string | null): SiteEconomics | null {
  if (!stored) {
    return null;
  }
  try {
    const parsed = siteEconomicsSchema.safeParse(JSON.parse(stored));
    return parsed.success ? parsed.data : null;
  } catch {
    return null;
  }
}
