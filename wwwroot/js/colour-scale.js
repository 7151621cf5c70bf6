// Colour scales of the atlas, defined in OKLab (a perceptual colour space) and resampled so that equal steps of the
// scale are equal perceived colour differences (equal Euclidean distance in OKLab, the space's ΔE).
//
// "seabed to foam" (sequential): lightness rises linearly from 0.20 to 0.93 while the hue turns from deep indigo
// through blue and cyan to a pale sea-foam green and ends on sand; chroma swells in the middle. Lightness is monotonic, so the order of
// values survives greyscale printing and the common colour-vision deficiencies.
// "compass" (cyclic, for directions): constant lightness and chroma, hue once round the circle, so 359° and 1° meet.
//
// OKLab conversion matrices: B. Ottosson, "A perceptual color space for image processing" (2020), published values.

const lutSize = 256;

function linearToSrgb(x) {
  return x <= 0.0031308 ? 12.92 * x : 1.055 * Math.pow(x, 1 / 2.4) - 0.055;
}

function srgbToLinear(x) {
  return x <= 0.04045 ? x / 12.92 : Math.pow((x + 0.055) / 1.055, 2.4);
}

/** OKLab (L, a, b) to linear-light sRGB, unclipped. */
export function oklabToLinearRgb(L, a, b) {
  const l = (L + 0.3963377774 * a + 0.2158037573 * b) ** 3;
  const m = (L - 0.1055613458 * a - 0.0638541728 * b) ** 3;
  const s = (L - 0.0894841775 * a - 1.2914855480 * b) ** 3;
  return [
    4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s,
    -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s,
    -0.0041960863 * l - 0.7034186147 * m + 1.7076147010 * s,
  ];
}

/** Gamma-encoded sRGB (0..1 each) to OKLab. */
export function srgbToOklab(r, g, b) {
  const R = srgbToLinear(r), G = srgbToLinear(g), B = srgbToLinear(b);
  const l = Math.cbrt(0.4122214708 * R + 0.5363325363 * G + 0.0514459929 * B);
  const m = Math.cbrt(0.2119034982 * R + 0.6806995451 * G + 0.1073969566 * B);
  const s = Math.cbrt(0.0883024619 * R + 0.2817188376 * G + 0.6299787005 * B);
  return [
    0.2104542553 * l + 0.7936177850 * m - 0.0040720468 * s,
    1.9779984951 * l - 2.4285922050 * m + 0.4505937099 * s,
    0.0259040371 * l + 0.7827717662 * m - 0.8086757660 * s,
  ];
}

function inGamut(rgb) {
  return rgb.every(c => c >= -1e-6 && c <= 1 + 1e-6);
}

/** The OKLab colour of lightness L, chroma C and hue h (degrees), with chroma reduced until it fits sRGB. */
function fitLch(L, C, h) {
  const rad = h * Math.PI / 180;
  let lo = 0, hi = C;
  if (inGamut(oklabToLinearRgb(L, C * Math.cos(rad), C * Math.sin(rad)))) lo = C;
  else for (let k = 0; k < 24; k++) {
    const mid = (lo + hi) / 2;
    if (inGamut(oklabToLinearRgb(L, mid * Math.cos(rad), mid * Math.sin(rad)))) lo = mid; else hi = mid;
  }
  return [L, lo * Math.cos(rad), lo * Math.sin(rad)];
}

function toBytes(lab) {
  return oklabToLinearRgb(...lab).map(c => Math.round(255 * linearToSrgb(Math.min(1, Math.max(0, c)))));
}

// Samples a path densely, then picks lutSize colours at equal arc length in OKLab.
function equalDifferenceTable(path, closed) {
  const samples = 2048;
  const points = [];
  for (let k = 0; k <= samples; k++) points.push(path(k / samples));
  const arc = [0];
  for (let k = 1; k < points.length; k++) {
    const [p, q] = [points[k - 1], points[k]];
    arc.push(arc[k - 1] + Math.hypot(q[0] - p[0], q[1] - p[1], q[2] - p[2]));
  }
  const total = arc[arc.length - 1];
  const table = new Uint8ClampedArray(lutSize * 3);
  let j = 0;
  for (let i = 0; i < lutSize; i++) {
    const target = total * i / (closed ? lutSize : lutSize - 1);
    while (j < arc.length - 2 && arc[j + 1] < target) j++;
    const f = arc[j + 1] > arc[j] ? (target - arc[j]) / (arc[j + 1] - arc[j]) : 0;
    const lab = [0, 1, 2].map(c => points[j][c] + f * (points[j + 1][c] - points[j][c]));
    table.set(toBytes(lab), i * 3);
  }
  return table;
}

function seabedToFoam(t) {
  const L = 0.20 + 0.73 * t;
  const h = 290 - 215 * Math.pow(t, 1.4);
  const C = 0.07 + 0.08 * Math.sin(Math.PI * t);
  return fitLch(L, C, h);
}

function compassChroma(L) {
  // The largest chroma every hue can take at this lightness, so the cyclic path never needs clipping.
  let c = 0.4;
  for (let h = 0; h < 360; h += 2) c = Math.min(c, fitLch(L, 0.4, h).slice(1).reduce((s, v) => Math.hypot(s, v), 0));
  return 0.97 * c;
}

const compassL = 0.70;
const compassC = compassChroma(compassL);

/** A colour scale: a name, whether it wraps round, and a 256-entry RGB table. */
export class ColourScale {
  constructor(name, cyclic, table) {
    this.name = name;
    this.cyclic = cyclic;
    this.table = table;
  }

  /** RGB bytes of the fraction t (0..1); clamped, or wrapped for a cyclic scale. */
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

export const sequentialScale = new ColourScale('seabed to foam', false, equalDifferenceTable(seabedToFoam, false));
export const cyclicScale = new ColourScale('compass', true,
  equalDifferenceTable(t => fitLch(compassL, compassC, 360 * t), true));

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
