// The atlas's colour scales. Their one definition is on the server (src/Atlas.Api/Downloads/ColourScale.cs and
// DirectionColourScale.cs), which draws the figures with them; the page reads the same 256-entry tables from
// GET /api/v1/colour-scales (boot.js starts the request) and indexes them the same way, so the two cannot drift.
// "deep to shore" (sequential): a deep-sea navy through teal to a warm sand, lightness rising monotonically.
// "bearing" (cyclic, for directions): constant lightness, the hue once round the circle, so 359° and 1° meet.

const lutSize = 256;

function srgbToLinear(x) {
  return x <= 0.04045 ? x / 12.92 : Math.pow((x + 0.055) / 1.055, 2.4);
}

/** A colour scale: a name, whether it wraps round, and a 256-entry RGB table (filled by loadColourScales). */
export class ColourScale {
  constructor(cyclic) {
    this.name = '';
    this.cyclic = cyclic;
    this.table = new Uint8ClampedArray(lutSize * 3);
  }

  /** Takes the server's table: 256 colours as #rrggbb. */
  fill(scale) {
    if (!Array.isArray(scale?.colours) || scale.colours.length !== lutSize) throw new Error('the colour scale table is not 256 colours');
    this.name = scale.name;
    scale.colours.forEach((hex, i) => this.table.set([1, 3, 5].map(k => parseInt(hex.slice(k, k + 2), 16)), 3 * i));
  }

  /** RGB bytes of the fraction t (0..1): clamped and rounded to the nearest entry, or wrapped for a cyclic scale. */
  rgb(t) {
    let i;
    if (this.cyclic) i = ((Math.floor(t * lutSize) % lutSize) + lutSize) % lutSize;
    else i = Math.max(0, Math.min(lutSize - 1, Math.round(t * (lutSize - 1))));
    return [this.table[3 * i], this.table[3 * i + 1], this.table[3 * i + 2]];
  }

  css(t) {
    const [r, g, b] = this.rgb(t);
    return `rgb(${r} ${g} ${b})`;
  }

  /** A CSS linear-gradient through the scale, for colour bars. */
  gradient(direction = 'to right') {
    const stops = [];
    for (let k = 0; k <= 16; k++) stops.push(`${this.css(k / 16)} ${(k * 100 / 16).toFixed(2)}%`);
    return `linear-gradient(${direction}, ${stops.join(', ')})`;
  }
}

export const sequentialScale = new ColourScale(false);
export const cyclicScale = new ColourScale(true);

/** Fills both scales from GET /api/v1/colour-scales (or the answer boot.js already asked for). */
export async function loadColourScales(pending) {
  const scales = await (pending ?? fetch('/api/v1/colour-scales').then(r => r.ok ? r.json() : Promise.reject(new Error(`colour scales: ${r.status}`))));
  sequentialScale.fill(scales.sequential);
  cyclicScale.fill(scales.direction);
}

/** Relative luminance (WCAG 2) of RGB bytes, for choosing legible text over a coloured cell. */
export function relativeLuminance([r, g, b]) {
  const [R, G, B] = [r, g, b].map(v => srgbToLinear(v / 255));
  return 0.2126 * R + 0.7152 * G + 0.0722 * B;
}

/** Black or white text, whichever contrasts more with the background bytes. */
export function textColourOn(rgb) {
  const y = relativeLuminance(rgb);
  return (y + 0.05) / 0.05 >= 1.05 / (y + 0.05) ? '#000' : '#fff';
}
