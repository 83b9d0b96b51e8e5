import { PARAMETER_NAMES, type EconomicParameters } from '../../../../shared/economics/economic-parameters';

export { PARAMETER_NAMES };

/**
 * The shortlist's reasons and assumptions come from the server as English sentences of a known
 * shape (server/shortlist/shortlist.service.ts, shared/engine/shortlist.ts). The screen says them in
 * the person's language by recognising each shape and giving its key with the numbers it holds;
 * a sentence of no known shape is shown as the server wrote it (`text`), never dropped.
 */
export type ServerText =
  | { readonly key: string; readonly params: Readonly<Record<string, string | number>> }
  | { readonly text: string };

/** A number the sentence holds, or a percent ("60.0 %"), kept as a number for the locale's format. */
type Captured = { readonly name: string; readonly kind: 'number' | 'percent' | 'text' | 'field' | 'value' };

interface Shape {
  readonly pattern: RegExp;
  readonly key: string;
  readonly captures: readonly Captured[];
}

const num = (name: string): Captured => ({ name, kind: 'number' });
const pct = (name: string): Captured => ({ name, kind: 'percent' });
const txt = (name: string): Captured => ({ name, kind: 'text' });
const field = (name: string): Captured => ({ name, kind: 'field' });
/** A parameter's value: a number in the locale's digits, or the text as written (a currency code). */
const value = (name: string): Captured => ({ name, kind: 'value' });
const NUMBER = '(-?\\d+(?:\\.\\d+)?)';

const REASONS: readonly Shape[] = [
  { pattern: /^no tonnage: (.+)$/, key: 'shortlist.reasons.noTonnageBecause', captures: [txt('detail')] },
  { pattern: /^no tonnage$/, key: 'shortlist.reasons.noTonnage', captures: [] },
  { pattern: /^no graded samples yet$/, key: 'shortlist.reasons.noGradedSamples', captures: [] },
  { pattern: new RegExp(`^too few samples: ${NUMBER} graded, ${NUMBER} needed to rank$`), key: 'shortlist.reasons.tooFewSamples', captures: [num('graded'), num('needed')] },
  { pattern: /^no footprint, so no haul distance$/, key: 'shortlist.reasons.noFootprint', captures: [] },
  { pattern: /^the site has no processing point, so no haul distance$/, key: 'shortlist.reasons.noProcessingPoint', captures: [] },
];

const ASSUMPTIONS: readonly Shape[] = [
  { pattern: new RegExp(`^recovery ${NUMBER} %: feed-mass-weighted two-product recovery of ${NUMBER} accepted trial\\(s\\)$`), key: 'shortlist.assumptions.recoveryTrials', captures: [pct('recovery'), num('count')] },
  { pattern: new RegExp(`^recovery ${NUMBER} %: what-if value, not from trials$`), key: 'shortlist.assumptions.recoveryWhatIf', captures: [pct('recovery')] },
  { pattern: new RegExp(`^recovery ${NUMBER} %: stated default, no accepted trial yet$`), key: 'shortlist.assumptions.recoveryDefault', captures: [pct('recovery')] },
  { pattern: /^grade: assay where present, else calibrated pan estimate, else pan estimate \(flagged per pile\)$/, key: 'shortlist.assumptions.gradeOrder', captures: [] },
  { pattern: new RegExp(`^piles with fewer than ${NUMBER} graded samples, no tonnage or no haul distance are listed but not ranked$`), key: 'shortlist.assumptions.notRanked', captures: [num('count')] },
  { pattern: new RegExp(`^troy ounce = ${NUMBER} g$`), key: 'shortlist.assumptions.troyOunce', captures: [num('grams')] },
  { pattern: /^haul distance = straight line from pile centroid to processing point × road factor$/, key: 'shortlist.assumptions.haulDistance', captures: [] },
  { pattern: /^owner share is taken from gross value$/, key: 'shortlist.assumptions.ownerShare', captures: [] },
  { pattern: new RegExp(`^conservative net value uses the lower bound of the grade's ${NUMBER} % confidence interval$`), key: 'shortlist.assumptions.conservative', captures: [pct('level')] },
  { pattern: new RegExp(`^recovery \\+${NUMBER} % is capped at 1$`), key: 'shortlist.assumptions.recoveryCap', captures: [pct('step')] },
  { pattern: /^(\w+) is the built-in default \((.*)\), not set for this site$/, key: 'shortlist.assumptions.builtIn', captures: [field('field'), value('value')] },
];

/**
 * How the values a shape captured are shown: numbers and percents in the locale's digits (a percent
 * arrives as "60.0" and is shown as 60,0 % in French), parameter names as their label's key.
 */
export interface ServerTextFormat {
  number(value: number): string;
  percent(value: number): string;
  field(name: string): string;
}

function recognise(sentence: string, shapes: readonly Shape[], format: ServerTextFormat): ServerText {
  for (const shape of shapes) {
    const match = shape.pattern.exec(sentence);
    if (!match) continue;
    const params: Record<string, string | number> = {};
    let isKnown = true;
    shape.captures.forEach((capture, index) => {
      const raw = match[index + 1];
      if (capture.kind === 'number') params[capture.name] = format.number(Number(raw));
      else if (capture.kind === 'percent') params[capture.name] = format.percent(Number(raw) / 100);
      else if (capture.kind === 'field') {
        if (PARAMETER_NAMES.includes(raw as keyof EconomicParameters)) params[capture.name] = format.field(raw);
        else isKnown = false;
      } else if (capture.kind === 'value') params[capture.name] = /^-?\d+(\.\d+)?$/.test(raw) ? format.number(Number(raw)) : raw;
      else params[capture.name] = raw;
    });
    if (isKnown) return { key: shape.key, params };
  }
  return { text: sentence };
}

/** A reason a pile is too thin to rank, in the person's language where its shape is known. */
export function thinDataReason(sentence: string, format: ServerTextFormat): ServerText {
  return recognise(sentence, REASONS, format);
}

/** One of the shortlist's assumptions, in the person's language where its shape is known. */
export function assumption(sentence: string, format: ServerTextFormat): ServerText {
  return recognise(sentence, ASSUMPTIONS, format);
}
