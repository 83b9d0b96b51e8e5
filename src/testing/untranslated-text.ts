import {
  BindingPipe, CombinedRecursiveAstVisitor, Interpolation, LiteralPrimitive, TmplAstBoundText, TmplAstElement,
  TmplAstText, TmplAstTextAttribute, parseTemplate,
} from '@angular/compiler';
import type { AST, TmplAstNode } from '@angular/compiler';
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

/** Text a person reads, found in a template without a translation key. */
export interface UntranslatedText {
  readonly file: string;
  readonly line: number;
  readonly text: string;
}

/** Attributes whose value is read by a person or a screen reader. */
const READ_ATTRIBUTES = new Set(['aria-label', 'aria-description', 'aria-placeholder', 'title', 'placeholder', 'alt', 'label', 'mattooltip']);
/** Elements whose text is not prose: icon ligatures and the like. */
const NON_PROSE_ELEMENTS = new Set(['mat-icon', 'style', 'script']);
/** Pipes whose argument is a format, not words. */
const FORMAT_PIPES = new Set(['hsNumber', 'hsDate', 'hsPercent', 'number', 'date', 'percent', 'transloco', 'slice', 'json']);
/**
 * Tokens written the same in every language: the brand, metric units and symbols (units stay
 * metric, DESIGN §7), and the sample-code shape. What remains after removing them must hold no letter.
 */
const LANGUAGE_NEUTRAL = /\b(?:Heapsight|g\/t|mg\/kg|t·km|t\/m³|kg|mg|km|mm|µm|μm|m²|m³|ppm|oz|g|t|m|h|s|°|QR|GPS|CSV|PDF|ID|SD|CV|R²|n|US\$|USD)\b|[°%·×±–—…/()\[\]:;,.!?'"&+\-=<>#@*0-9\s]/gu;

function hasWords(text: string): boolean {
  return /\p{L}/u.test(text.replace(/&[a-z]+;/g, ' ').replace(LANGUAGE_NEUTRAL, ' '));
}

/** A string literal in an expression that reads as prose rather than a key, class, icon or value. */
function isProseLiteral(value: string): boolean {
  if (/^[a-z][\w-]*(\.[\w-]+)+$/.test(value)) return false; // a translation key
  if (/^[a-z0-9_-]+$/.test(value)) return false; // an icon ligature, class, route or enum value
  return hasWords(value) && (/\s/.test(value.trim()) || /^\p{Lu}\p{Ll}/u.test(value));
}

class Finder extends CombinedRecursiveAstVisitor {
  readonly found: { text: string; offset: number }[] = [];
  private readonly elements: string[] = [];
  private nonProseDepth = 0;

  override visitElement(element: TmplAstElement): void {
    const isNonProse = NON_PROSE_ELEMENTS.has(element.name);
    if (isNonProse) this.nonProseDepth++;
    for (const attribute of element.attributes) this.checkAttribute(attribute);
    this.elements.push(element.name);
    super.visitElement(element);
    this.elements.pop();
    if (isNonProse) this.nonProseDepth--;
  }

  override visitText(text: TmplAstText): void {
    if (this.nonProseDepth === 0 && hasWords(text.value)) this.report(text.value, text.sourceSpan.start.offset);
  }

  override visitBoundText(text: TmplAstBoundText): void {
    const value = (text.value as unknown as { ast: AST }).ast;
    if (value instanceof Interpolation && this.nonProseDepth === 0) {
      for (const part of value.strings) if (hasWords(part)) this.report(part, text.sourceSpan.start.offset);
    }
    super.visitBoundText(text);
  }

  override visitPipe(pipe: BindingPipe): void {
    this.visit(pipe.exp);
    if (!FORMAT_PIPES.has(pipe.name)) for (const arg of pipe.args) this.visit(arg);
  }

  override visitLiteralPrimitive(literal: LiteralPrimitive): void {
    if (this.nonProseDepth === 0 && typeof literal.value === 'string' && isProseLiteral(literal.value)) {
      this.report(literal.value, literal.sourceSpan.start);
    }
  }

  private checkAttribute(attribute: TmplAstTextAttribute): void {
    if (READ_ATTRIBUTES.has(attribute.name.toLowerCase()) && hasWords(attribute.value)) {
      this.report(attribute.value, attribute.sourceSpan.start.offset);
    }
  }

  private readonly seen = new Set<string>();

  private report(text: string, offset: number): void {
    const clean = text.trim().replace(/\s+/g, ' ');
    const key = `${offset}:${clean}`;
    if (this.seen.has(key)) return; // the combined visitor can reach a node by two paths
    this.seen.add(key);
    this.found.push({ text: clean, offset });
  }
}

/** Untranslated text in one template; `baseOffset` places it within the file it came from. */
export function untranslatedTextIn(template: string, file: string, fileText = template, baseOffset = 0): UntranslatedText[] {
  const parsed = parseTemplate(template, file, { preserveWhitespaces: false });
  if (parsed.errors?.length) throw new Error(`${file}: ${parsed.errors.map((error) => error.msg).join('; ')}`);
  const finder = new Finder();
  for (const node of parsed.nodes as TmplAstNode[]) node.visit(finder);
  return finder.found.map(({ text, offset }) => ({
    file,
    line: fileText.slice(0, baseOffset + offset).split('\n').length,
    text,
  }));
}

/** Inline `template:` literals of the components in one TypeScript file. */
export function inlineTemplates(source: string): { template: string; offset: number }[] {
  const templates: { template: string; offset: number }[] = [];
  const pattern = /\btemplate:\s*`/g;
  for (let match = pattern.exec(source); match; match = pattern.exec(source)) {
    const start = match.index + match[0].length;
    const end = source.indexOf('`', start);
    templates.push({ template: source.slice(start, end), offset: start });
    pattern.lastIndex = end + 1;
  }
  return templates;
}

function filesUnder(folder: string, keep: (file: string) => boolean): string[] {
  return readdirSync(folder).flatMap((name: string) => {
    const path = join(folder, name);
    if (statSync(path).isDirectory()) return filesUnder(path, keep);
    return keep(path) ? [path] : [];
  });
}

/** Every piece of untranslated text in the app's templates (inline and `.html`). */
export function untranslatedTextInApp(root: string): UntranslatedText[] {
  const app = join(root, 'src/app');
  const isComponentSource = (file: string) =>
    (file.endsWith('.ts') && !file.endsWith('.spec.ts')) || file.endsWith('.html');
  return filesUnder(app, isComponentSource).flatMap((path) => {
    const text = readFileSync(path, 'utf8');
    const file = relative(root, path);
    if (path.endsWith('.html')) return untranslatedTextIn(text, file);
    return inlineTemplates(text).flatMap(({ template, offset }) => untranslatedTextIn(template, file, text, offset));
  });
}
