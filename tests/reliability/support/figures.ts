import { appendFileSync } from 'node:fs';

/**
 * Prints one line of figures (faults injected, inputs refused, mutations sent and found) that the
 * closing note quotes, and appends it to RELIABILITY_FIGURES_FILE when that is set.
 */
export function reportReliabilityFigures(story: string, figures: Record<string, unknown>): void {
  const line = `RELIABILITY ${JSON.stringify({ story, ...figures })}\n`;
  process.stdout.write(line);
  const file = process.env['RELIABILITY_FIGURES_FILE'];
  if (file) {
    appendFileSync(file, line);
  }
}
