/**
 * Heapsight's grade ramp, computed in OKLab (Ottosson 2020) so that equal steps in grade look like
 * equal steps in colour: lightness falls linearly from 0.95 to 0.32, chroma swells in the middle and
 * the hue turns from a pale straw (100°) through teal to a deep violet (300°). Light means low grade,
 * dark means high, which also reads in greyscale and for the common colour-vision deficiencies
 * because lightness alone is monotonic. The ramp is ours; it imitates no other tool's.
 */

/** Steps in the look-up table; 256 is finer than a screen can show on a 200-cell grid. */
export const RAMP_STEPS = 256;

const LIGHTNESS_START = 0.95;
const LIGHTNESS_END = 0.32;
const CHROMA_BASE = 0.05;
const CHROMA_SWELL = 0.09;
const HUE_START_DEG = 100;
const HUE_END_DEG = 300;

function linearToSrgb(value: number): number {
  const clipped = Math.min(1, Math.max(0, value));
  return clipped <= 0.0031308 ? 12.92 * clipped : 1.055 * clipped ** (1 / 2.4) - 0.055;
}

/** OKLab (L, a, b) to 8-bit sRGB, clipped into the gamut (Ottosson's published matrices). */
export function oklabToRgb(lightness: number, a: number, b: number): [number, number, number] {
  const l = (lightness + 0.3963377774 * a + 0.2158037573 * b) ** 3;
  const m = (lightness - 0.1055613458 * a - 0.0638541728 * b) ** 3;
  const s = (lightness - 0.0894841775 * a - 1.291485548 * b) ** 3;
  const red = 4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s;
  const green = -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s;
  const blue = -0.0041960863 * l - 0.7034186147 * m + 1.707614701 * s;
  return [red, green, blue].map((channel) => Math.round(linearToSrgb(channel) * 255)) as [number, number, number];
}

/** The ramp's colour at t in [0, 1] (clamped), as 8-bit sRGB. */
export function rampRgb(t: number): [number, number, number] {
  const position = Math.min(1, Math.max(0, Number.isFinite(t) ? t : 0));
  const lightness = LIGHTNESS_START + (LIGHTNESS_END - LIGHTNESS_START) * position;
  const chroma = CHROMA_BASE + CHROMA_SWELL * Math.sin(Math.PI * position);
  const hue = ((HUE_START_DEG + (HUE_END_DEG - HUE_START_DEG) * position) * Math.PI) / 180;
  return oklabToRgb(lightness, chroma * Math.cos(hue), chroma * Math.sin(hue));
}

/** The ramp's colour at t as a CSS colour. */
export function rampCss(t: number): string {
  const [red, green, blue] = rampRgb(t);
  return `rgb(${red} ${green} ${blue})`;
}

/** RAMP_STEPS colours as packed RGB triples, for painting a grid without maths per cell. */
export function rampTable(): Uint8ClampedArray {
  const table = new Uint8ClampedArray(RAMP_STEPS * 3);
  for (let step = 0; step < RAMP_STEPS; step += 1) {
    table.set(rampRgb(step / (RAMP_STEPS - 1)), step * 3);
  }
  return table;
}

/** A CSS linear gradient of the ramp (left low, right high) for legends. */
export function rampGradientCss(stops = 9): string {
  const parts = Array.from({ length: stops }, (_unused, index) => `${rampCss(index / (stops - 1))} ${Math.round((index / (stops - 1)) * 100)}%`);
  return `linear-gradient(to right, ${parts.join(', ')})`;
}
